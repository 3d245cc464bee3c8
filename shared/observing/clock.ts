// Wall-clock times at a site, in its IANA time zone, with the zone rules the runtime's Intl carries.

import { formatterFor, wallClockMs } from '../lunar/zone'

/** The wall-clock reading at an instant, as if it were a UTC instant (ms). */
function wallMs(instant: number, timeZone: string): number {
  return wallClockMs(instant, formatterFor(timeZone, 'timeZone'))
}

export function isValidTimeZone(timeZone: string): boolean {
  try {
    formatterFor(timeZone, 'timeZone')
    return true
  }
  catch {
    return false
  }
}

/**
 * The instant that a site's clock shows as `localDate` `localTime` (HH:MM or HH:MM:SS). In the hour the
 * clocks go back the earlier of the two instants is taken; a time the clocks skip is a RangeError.
 */
export function zonedInstant(localDate: string, localTime: string, timeZone: string): Date {
  const d = /^(\d{4})-(\d{2})-(\d{2})$/.exec(localDate)
  const t = /^(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(localTime)
  if (!d) throw new RangeError(`localDate must be YYYY-MM-DD; got ${JSON.stringify(localDate)}`)
  if (!t) throw new RangeError(`localTime must be HH:MM; got ${JSON.stringify(localTime)}`)
  // setUTCFullYear, unlike Date.UTC, takes a year below 100 as it is rather than as 19xx.
  const check = new Date(0)
  check.setUTCFullYear(Number(d[1]), Number(d[2]) - 1, Number(d[3]))
  check.setUTCHours(Number(t[1]), Number(t[2]), Number(t[3] ?? 0), 0)
  const wanted = check.getTime()
  if (check.getUTCFullYear() !== Number(d[1]) || check.getUTCDate() !== Number(d[3]) || check.getUTCHours() !== Number(t[1]) || check.getUTCMinutes() !== Number(t[2])) {
    throw new RangeError(`${localDate} ${localTime} is not a real date and time`)
  }
  // Offsets a day either side bracket any clock change near the wanted time.
  const candidates = [wanted - (wallMs(wanted - 86_400_000, timeZone) - (wanted - 86_400_000)),
    wanted - (wallMs(wanted + 86_400_000, timeZone) - (wanted + 86_400_000))]
    .filter(instant => wallMs(instant, timeZone) === wanted)
  if (candidates.length === 0) throw new RangeError(`${localDate} ${localTime} does not exist in ${timeZone}: the clocks skip it`)
  return new Date(Math.min(...candidates))
}

/** Local date and time (HH:MM) of an instant at a site. */
export function localDateTimeOf(at: Date, timeZone: string): { date: string, time: string } {
  const iso = new Date(wallMs(at.getTime(), timeZone)).toISOString()
  return { date: iso.slice(0, 10), time: iso.slice(11, 16) }
}

/** Hours east of UTC at an instant, e.g. 1 for British Summer Time. */
export function utcOffsetHours(at: Date, timeZone: string): number {
  const whole = Math.floor(at.getTime() / 1000) * 1000
  return (wallMs(whole, timeZone) - whole) / 3_600_000
}
