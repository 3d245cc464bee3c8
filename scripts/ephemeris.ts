// Prints the Moon's circumstances for an instant and a site, with that local day's Moon and Sun events.
//   npm run ephemeris -- --at 2026-03-14T20:30:00Z --lat 51.5 --lon -0.1 [--elev 30] [--tz Europe/London]

import { parseArgs } from 'node:util'
import {
  localDateOf,
  lunarCircumstances,
  lunationBounds,
  riseSetTransit,
  sunCaution,
} from '../shared/lunar/index'
import type { RiseSetTransit, Site } from '../shared/lunar/index'

const USAGE = 'usage: npm run ephemeris -- --at <ISO instant> --lat <deg> --lon <deg, east +> [--elev <m>] [--tz <IANA zone>]'

/** A number only if the whole text is one; the module then range-checks it and names the field. */
function numberFrom(text: string | undefined, option: string): number | undefined {
  if (text === undefined) return undefined
  const value = Number(text)
  if (text.trim() === '' || !Number.isFinite(value)) throw new RangeError(`--${option} must be a number; got "${text}"`)
  return value
}

function withLocalTimes(events: RiseSetTransit, timeZone: string) {
  const clock = new Intl.DateTimeFormat('en-GB', { timeZone, timeStyle: 'short', hourCycle: 'h23' })
  // Local clock time to the nearest minute, as almanacs print it.
  const local = (at: Date) => clock.format(new Date(Math.round(at.getTime() / 60_000) * 60_000))
  const both = (at: Date | null) => (at ? { utc: at.toISOString(), local: local(at) } : null)
  return { rise: both(events.rise), transit: both(events.transit), set: both(events.set) }
}

// parseArgs reads "--lon -0.1" as two options; western longitudes and southern latitudes are ordinary here,
// so a negative number after a numeric option is joined to it ("--lon=-0.1").
function joinNegativeNumbers(argv: string[]): string[] {
  const joined: string[] = []
  for (let i = 0; i < argv.length; i++) {
    const option = argv[i]!
    const next = argv[i + 1]
    if (['--lat', '--lon', '--elev'].includes(option) && next !== undefined && /^-(\d|\.\d)/.test(next)) {
      joined.push(`${option}=${next}`)
      i++
    }
    else {
      joined.push(option)
    }
  }
  return joined
}

function main(argv: string[]): void {
  const { values } = parseArgs({
    args: joinNegativeNumbers(argv),
    options: {
      at: { type: 'string' },
      lat: { type: 'string' },
      lon: { type: 'string' },
      elev: { type: 'string' },
      tz: { type: 'string', default: 'UTC' },
    },
    strict: true,
    allowPositionals: false,
  })
  if (values.at === undefined || values.lat === undefined || values.lon === undefined) {
    throw new RangeError(`--at, --lat and --lon are required\n${USAGE}`)
  }
  const at = new Date(values.at)
  if (!/^\d{4}-\d{2}-\d{2}T/.test(values.at) || Number.isNaN(at.getTime())) {
    throw new RangeError(`--at must be an ISO 8601 instant such as 2026-03-14T20:30:00Z; got "${values.at}"`)
  }
  const elevation = numberFrom(values.elev, 'elev')
  const site: Site = {
    latitude: numberFrom(values.lat, 'lat')!,
    longitude: numberFrom(values.lon, 'lon')!,
    ...(elevation === undefined ? {} : { elevation }),
  }
  const timeZone = values.tz
  const localDate = localDateOf(at, timeZone)
  const lunation = lunationBounds(at)
  const report = {
    at: at.toISOString(),
    site,
    timeZone,
    localDate,
    circumstances: lunarCircumstances(at, site),
    caution: sunCaution(at, site),
    lunation: { previousNewMoon: lunation.previousNewMoon.toISOString(), nextNewMoon: lunation.nextNewMoon.toISOString() },
    moon: withLocalTimes(riseSetTransit('moon', localDate, site, timeZone), timeZone),
    sun: withLocalTimes(riseSetTransit('sun', localDate, site, timeZone), timeZone),
  }
  process.stdout.write(`${JSON.stringify(report, null, 2)}\n`)
}

try {
  main(process.argv.slice(2))
}
catch (error) {
  process.stderr.write(`ephemeris: ${error instanceof Error ? error.message : String(error)}\n`)
  process.exitCode = 2
}
