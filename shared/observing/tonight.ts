// The night's plan for a site and a local date: when it gets dark, where the Moon is through the night, when
// it rises and sets, and the observing windows of the coming fortnight.

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
import { moonPass, type MoonPass } from './moonpass'
import type { ObservingSite } from './night'
import { LOW_ALTITUDE_DEG, eveningWindowStart, morningWindowStart, observingWindows, type ObservingWindow } from './windows'

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

export interface DrawnMoment {
  at: string
  /** dusk: the Moon is up at nightfall; later: it rises (or climbs) later in the night; down: it is not up in the dark at all. */
  reason: 'dusk' | 'later' | 'down'
}

export interface NightPlan {
  localDate: string
  sun: ReturnType<typeof isoEvents>
  /** Moonrise, transit and set of the Moon's pass under way at nightfall, or of its next pass. */
  moon: MoonPass
  /** The instant night begins: sunset, or the evening window where the Sun does not set. */
  nightfall: string
  dusk: { civil: string | null, nautical: string | null, astronomical: string | null }
  /** The start of the next morning's civil twilight (or the darkest moment where there is none). */
  dawn: string
  /** The moment the disk is drawn for: one with the Moon up in a dark sky where there is one. */
  drawn: DrawnMoment
  at: string
  circumstances: ReturnType<typeof lunarCircumstances>
  caution: ReturnType<typeof sunCaution>
  samples: EveningSample[]
  nextPhases: { kind: PhaseEvent['kind'], at: string }[]
  /** The observing windows of the next 14 days from the chosen night (its evening, or the next morning) on. */
  windows: ObservingWindow[]
  /** The same date one lunation earlier and later, to step through lunations. */
  lunationStep: { previous: string, next: string }
}

export const WINDOW_DAYS = 14
const SYNODIC_MONTH_MS = 29.530589 * 86_400_000
// A Moon this high clears the haze and most horizons (common practice, as in the window verdicts).
const DRAWN_ALTITUDE_DEG = 10

/** The moment to draw the disk for: nightfall if the Moon is up, else the first dark sample it stands 10° up, else its highest. */
function drawnMoment(samples: EveningSample[], nightfall: Date, dawn: Date): DrawnMoment {
  const dark = samples.filter(s => Date.parse(s.at) >= nightfall.getTime() - 15 * MINUTE && Date.parse(s.at) <= dawn.getTime())
  const first = dark[0]
  if (!first) return { at: nightfall.toISOString(), reason: 'down' }
  if (first.moonAltitudeDeg >= LOW_ALTITUDE_DEG) return { at: first.at, reason: 'dusk' }
  const clear = dark.find(s => s.moonAltitudeDeg >= DRAWN_ALTITUDE_DEG)
  if (clear) return { at: clear.at, reason: 'later' }
  const highest = dark.reduce((best, s) => (s.moonAltitudeDeg > best.moonAltitudeDeg ? s : best), first)
  if (highest.moonAltitudeDeg <= 0) return { at: first.at, reason: 'down' }
  return { at: highest.at, reason: highest === first ? 'dusk' : 'later' }
}

/** Everything the Tonight page shows, for one site and the night that begins on one local date. */
export function planNight(localDate: string, site: ObservingSite): NightPlan {
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation }
  const observer = new Observer(site.latitude, site.longitude, site.elevation)
  const sun = riseSetTransit('sun', localDate, place, site.timeZone)
  const noon = zonedInstant(localDate, '12:00', site.timeZone)
  const windowStart = eveningWindowStart(localDate, site)
  const nightfall = sun.set && sun.set.getTime() > noon.getTime() ? sun.set : windowStart
  const dawn = morningWindowStart(addDays(localDate, 1), site)
  const sunrise = riseSetTransit('sun', addDays(localDate, 1), place, site.timeZone).rise
  // From an hour before sunset (or 16:00) to the next sunrise (or half an hour after dawn), every 15 minutes.
  const from = sun.set ? new Date(sun.set.getTime() - 60 * MINUTE) : zonedInstant(localDate, '16:00', site.timeZone)
  const until = sunrise && sunrise.getTime() > dawn.getTime() ? sunrise : new Date(dawn.getTime() + 30 * MINUTE)
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
  const drawn = drawnMoment(samples, windowStart, dawn)
  const at = new Date(drawn.at)
  const afterNoon = (d: Date | null) => (d && d.getTime() - noon.getTime() < 20 * 3_600_000 ? d.toISOString() : null)
  const step = (sign: number) => localDateOf(new Date(noon.getTime() + sign * SYNODIC_MONTH_MS), site.timeZone)
  return {
    localDate,
    sun: isoEvents(sun),
    moon: moonPass(nightfall, site),
    nightfall: nightfall.toISOString(),
    dusk: {
      civil: afterNoon(sunDescendsTo(observer, noon, -6)),
      nautical: afterNoon(sunDescendsTo(observer, noon, -12)),
      astronomical: afterNoon(sunDescendsTo(observer, noon, -18)),
    },
    dawn: dawn.toISOString(),
    drawn,
    at: at.toISOString(),
    circumstances: lunarCircumstances(at, place),
    caution: sunCaution(at, place),
    samples,
    nextPhases: phaseEvents(noon, new Date(noon.getTime() + 32 * 86_400_000)).map(e => ({ kind: e.kind, at: e.at.toISOString() })),
    // The night's own windows onward: the chosen date's morning is already past when its night begins.
    windows: observingWindows(localDate, WINDOW_DAYS + 1, site).filter(w => Date.parse(w.at) > noon.getTime()).slice(0, WINDOW_DAYS),
    lunationStep: { previous: step(-1), next: step(+1) },
  }
}
