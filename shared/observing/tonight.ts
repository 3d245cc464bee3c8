// The evening plan for a site and a local date: when it gets dark, where the Moon is through the evening,
// and which evenings of the lunation suit the start of a series.

import { Body, Observer, SearchAltitude } from 'astronomy-engine'
import {
  localDateOf,
  lunarCircumstances,
  lunationBounds,
  phaseEvents,
  riseSetTransit,
  sunCaution,
  type PhaseEvent,
  type RiseSetTransit,
} from '../lunar'
import { zonedInstant } from './clock'
import type { ObservingSite } from './night'

const MINUTE = 60_000

export interface EveningSample {
  at: string
  moonAltitudeDeg: number
  moonAzimuthDeg: number
  sunAltitudeDeg: number
}

export interface EveningRating {
  localDate: string
  at: string
  moonAltitudeDeg: number
  moonAzimuthDeg: number
  illuminatedFraction: number
  elongationDeg: number
  verdict: 'too-close-to-sun' | 'below-horizon' | 'low' | 'good'
  startHere: boolean
}

const iso = (d: Date | null | undefined) => d?.toISOString() ?? null
const isoEvents = (e: RiseSetTransit) => ({ rise: iso(e.rise), transit: iso(e.transit), set: iso(e.set) })

function addDays(localDate: string, days: number): string {
  const d = new Date(`${localDate}T12:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

/** The instant the Sun's centre sinks to `altitudeDeg` after `from`, within a day. */
function sunDescendsTo(observer: Observer, from: Date, altitudeDeg: number): Date | null {
  return SearchAltitude(Body.Sun, observer, -1, from, 1, altitudeDeg)?.date ?? null
}

/** The moment an evening's sketch would start: the end of civil twilight, else 21:00 local. */
export function eveningStart(localDate: string, site: ObservingSite): Date {
  const observer = new Observer(site.latitude, site.longitude, site.elevation)
  const noon = zonedInstant(localDate, '12:00', site.timeZone)
  const dusk = sunDescendsTo(observer, noon, -6)
  return dusk && dusk.getTime() - noon.getTime() < 18 * 3_600_000 ? dusk : zonedInstant(localDate, '21:00', site.timeZone)
}

/**
 * Rates one evening at the end of civil twilight. The thresholds are common practice for a naked-eye or
 * binocular campaign: a Moon within 15° of the Sun is not looked for (safety and glare), one below 5° of
 * altitude is lost in haze and behind the horizon's obstacles.
 */
export function rateEvening(localDate: string, site: ObservingSite): EveningRating {
  const at = eveningStart(localDate, site)
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation }
  const c = lunarCircumstances(at, place)
  let verdict: EveningRating['verdict'] = 'good'
  if (c.elongationDeg < 15) verdict = 'too-close-to-sun'
  else if (c.altitudeDeg < 0) verdict = 'below-horizon'
  else if (c.altitudeDeg < 5) verdict = 'low'
  return {
    localDate,
    at: at.toISOString(),
    moonAltitudeDeg: c.altitudeDeg,
    moonAzimuthDeg: c.azimuthDeg,
    illuminatedFraction: c.illuminatedFraction,
    elongationDeg: c.elongationDeg,
    verdict,
    startHere: false,
  }
}

/** Every evening from new moon to full; the first good waxing evening is where a series starts. */
export function lunationEvenings(around: Date, site: ObservingSite): EveningRating[] {
  const { previousNewMoon, nextNewMoon } = lunationBounds(around)
  const full = phaseEvents(previousNewMoon, nextNewMoon).find(e => e.kind === 'full')?.at ?? nextNewMoon
  const first = localDateOf(previousNewMoon, site.timeZone)
  const last = localDateOf(full, site.timeZone)
  const evenings: EveningRating[] = []
  for (let date = first; date <= last; date = addDays(date, 1)) evenings.push(rateEvening(date, site))
  const start = evenings.find(e => e.verdict === 'good')
  if (start) start.startHere = true
  return evenings
}

export interface NightPlan {
  localDate: string
  sun: ReturnType<typeof isoEvents>
  moon: ReturnType<typeof isoEvents>
  moonNextDay: ReturnType<typeof isoEvents>
  dusk: { civil: string | null, nautical: string | null, astronomical: string | null }
  at: string
  circumstances: ReturnType<typeof lunarCircumstances>
  caution: ReturnType<typeof sunCaution>
  samples: EveningSample[]
  nextPhases: { kind: PhaseEvent['kind'], at: string }[]
  evenings: EveningRating[]
}

/** Everything the Tonight page shows, for one site and one local date. */
export function planNight(localDate: string, site: ObservingSite): NightPlan {
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation }
  const observer = new Observer(site.latitude, site.longitude, site.elevation)
  const sun = riseSetTransit('sun', localDate, place, site.timeZone)
  const noon = zonedInstant(localDate, '12:00', site.timeZone)
  const at = eveningStart(localDate, site)
  // From an hour before sunset (or 16:00) to 02:00 the next morning, every 15 minutes.
  const from = sun.set ? new Date(sun.set.getTime() - 60 * MINUTE) : zonedInstant(localDate, '16:00', site.timeZone)
  const until = zonedInstant(addDays(localDate, 1), '02:00', site.timeZone)
  const samples: EveningSample[] = []
  for (let t = from.getTime(); t <= until.getTime(); t += 15 * MINUTE) {
    const when = new Date(t)
    const c = lunarCircumstances(when, place)
    samples.push({
      at: when.toISOString(),
      moonAltitudeDeg: c.altitudeDeg,
      moonAzimuthDeg: c.azimuthDeg,
      sunAltitudeDeg: sunCaution(when, place).sunAltitudeDeg,
    })
  }
  const afterNoon = (d: Date | null) => (d && d.getTime() - noon.getTime() < 20 * 3_600_000 ? d.toISOString() : null)
  return {
    localDate,
    sun: isoEvents(sun),
    moon: isoEvents(riseSetTransit('moon', localDate, place, site.timeZone)),
    moonNextDay: isoEvents(riseSetTransit('moon', addDays(localDate, 1), place, site.timeZone)),
    dusk: {
      civil: afterNoon(sunDescendsTo(observer, noon, -6)),
      nautical: afterNoon(sunDescendsTo(observer, noon, -12)),
      astronomical: afterNoon(sunDescendsTo(observer, noon, -18)),
    },
    at: at.toISOString(),
    circumstances: lunarCircumstances(at, place),
    caution: sunCaution(at, place),
    samples,
    nextPhases: phaseEvents(noon, new Date(noon.getTime() + 32 * 86_400_000)).map(e => ({ kind: e.kind, at: e.at.toISOString() })),
    evenings: lunationEvenings(at, site),
  }
}
