// Observing windows: the evenings (while the Moon waxes) and the mornings before dawn (while it wanes) when
// the Moon stands in a dark enough sky, rated for a site. Tonight, the worksheet and campaigns share them.
//
// Common practice: a waxing Moon is east of the Sun and follows it down, so it is seen in the evening sky; a
// waning Moon is west of the Sun and rises ahead of it, so it is seen before dawn. A window is rated at the
// end of evening civil twilight (Sun's centre 6° below the horizon) or the start of morning civil twilight;
// where the Sun never sinks that far (high latitude in summer), at the Sun's lowest point of that night.

import { Body, Observer, SearchAltitude, SearchHourAngle } from 'astronomy-engine'
import { localDayBounds, lunarCircumstances, moonSunLongitudeDifference } from '../lunar'
import { localDateTimeOf, zonedInstant } from './clock'
import type { ObservingSite } from './night'

export type WindowVerdict = 'too-close-to-sun' | 'below-horizon' | 'low' | 'good'

export interface ObservingWindow {
  /** The local calendar date (site's zone) on which the window falls: for a morning window, that morning's date. */
  localDate: string
  /** Evening (after sunset, Moon waxing) or morning (before dawn, Moon waning). */
  kind: 'evening' | 'morning'
  /** The instant the window is rated at (ISO UTC): end of evening civil twilight, or start of morning civil twilight. */
  at: string
  moonAltitudeDeg: number
  moonAzimuthDeg: number
  illuminatedFraction: number
  elongationDeg: number
  verdict: WindowVerdict
  /** The first good window of a waxing (or waning) series. */
  startHere: boolean
}

export type WindowKind = ObservingWindow['kind']

const DAY_MS = 86_400_000
const CIVIL_TWILIGHT_DEG = -6

/**
 * Verdict thresholds, common practice for a naked-eye, binocular or small-telescope series: a Moon within 15°
 * of the Sun is not looked for (safety and glare); one below 5° of altitude is lost in haze and behind the
 * horizon's obstacles.
 */
export const TOO_CLOSE_TO_SUN_DEG = 15
export const LOW_ALTITUDE_DEG = 5

/** A local date moved by whole days (calendar arithmetic, no time zone involved). */
export function addLocalDays(localDate: string, days: number): string {
  const d = new Date(`${localDate}T12:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

function observerOf(site: ObservingSite): Observer {
  return new Observer(site.latitude, site.longitude, site.elevation)
}

/** Local noon (never skipped by a clock change). */
function noonOf(localDate: string, site: ObservingSite): Date {
  return zonedInstant(localDate, '12:00', site.timeZone)
}

/** The Sun's lower culmination after `from`: the darkest moment of a night without civil twilight. */
function sunLowestAfter(observer: Observer, from: Date): Date {
  return SearchHourAngle(Body.Sun, observer, 12, from, +1).time.date
}

/** The end of evening civil twilight on `localDate`, or that night's darkest moment where there is none. */
export function eveningWindowStart(localDate: string, site: ObservingSite): Date {
  const observer = observerOf(site)
  const noon = noonOf(localDate, site)
  const dusk = SearchAltitude(Body.Sun, observer, -1, noon, 1, CIVIL_TWILIGHT_DEG)?.date
  const darkest = sunLowestAfter(observer, noon)
  return dusk && dusk.getTime() < darkest.getTime() ? dusk : darkest
}

/** The start of morning civil twilight on `localDate`, or the darkest moment of the night before where there is none. */
export function morningWindowStart(localDate: string, site: ObservingSite): Date {
  const observer = observerOf(site)
  const darkest = sunLowestAfter(observer, noonOf(addLocalDays(localDate, -1), site))
  const noon = noonOf(localDate, site)
  const dawn = SearchAltitude(Body.Sun, observer, +1, darkest, (noon.getTime() - darkest.getTime()) / DAY_MS, CIVIL_TWILIGHT_DEG)?.date
  return dawn ?? darkest
}

/** Which window a local date offers: an evening while the Moon waxes at that noon, a morning while it wanes. */
export function windowKindOn(localDate: string, site: ObservingSite): WindowKind {
  return moonSunLongitudeDifference(noonOf(localDate, site)) < 180 ? 'evening' : 'morning'
}

function verdictFor(altitudeDeg: number, elongationDeg: number): WindowVerdict {
  if (elongationDeg < TOO_CLOSE_TO_SUN_DEG) return 'too-close-to-sun'
  if (altitudeDeg < 0) return 'below-horizon'
  if (altitudeDeg < LOW_ALTITUDE_DEG) return 'low'
  return 'good'
}

/** How to find the instant of a window on another date: twilight, or the same clock time a fixed number of days on. */
type InstantRule = (localDate: string, kind: WindowKind) => Date

const twilightRule = (site: ObservingSite): InstantRule =>
  (localDate, kind) => (kind === 'evening' ? eveningWindowStart(localDate, site) : morningWindowStart(localDate, site))

function clockTimeRule(site: ObservingSite, anchorDate: string, at: Date): InstantRule {
  const local = localDateTimeOf(at, site.timeZone)
  const dayShift = Math.round((Date.parse(`${local.date}T00:00:00Z`) - Date.parse(`${anchorDate}T00:00:00Z`)) / DAY_MS)
  return (localDate) => {
    const date = addLocalDays(localDate, dayShift)
    try {
      return zonedInstant(date, local.time, site.timeZone)
    }
    catch {
      // A clock time the clocks skip that day: an hour later is the same moment on the day's new offset.
      const later = `${String(Number(local.time.slice(0, 2)) + 1).padStart(2, '0')}${local.time.slice(2)}`
      return zonedInstant(date, later, site.timeZone)
    }
  }
}

function rateAt(localDate: string, kind: WindowKind, site: ObservingSite, at: Date): ObservingWindow {
  const c = lunarCircumstances(at, { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation })
  return {
    localDate,
    kind,
    at: at.toISOString(),
    moonAltitudeDeg: c.altitudeDeg,
    moonAzimuthDeg: c.azimuthDeg,
    illuminatedFraction: c.illuminatedFraction,
    elongationDeg: c.elongationDeg,
    verdict: verdictFor(c.altitudeDeg, c.elongationDeg),
    startHere: false,
  }
}

// A half lunation is at most about 15.5 days; a series is never looked for further back than this.
const LONGEST_SERIES_DAYS = 17

/** Whether any window of the same series before `localDate` is good (the series being the run of dates of one kind). */
function seriesHasGoodBefore(localDate: string, kind: WindowKind, site: ObservingSite, rule: InstantRule): boolean {
  for (let back = 1; back <= LONGEST_SERIES_DAYS; back++) {
    const date = addLocalDays(localDate, -back)
    if (windowKindOn(date, site) !== kind) return false
    if (rateAt(date, kind, site, rule(date, kind)).verdict === 'good') return true
  }
  return false
}

/** The coming windows for `days` local dates starting at `fromLocalDate` (inclusive), in time order. */
export function observingWindows(fromLocalDate: string, days: number, site: ObservingSite): ObservingWindow[] {
  localDayBounds(fromLocalDate, site.timeZone) // validates the date and the zone
  if (!Number.isInteger(days) || days < 0 || days > 400) throw new RangeError(`days must be a whole number from 0 to 400; got ${days}`)
  const rule = twilightRule(site)
  const windows: ObservingWindow[] = []
  let previousKind: WindowKind | null = null
  let seriesHasGood = false
  for (let i = 0; i < days; i++) {
    const localDate = addLocalDays(fromLocalDate, i)
    const kind = windowKindOn(localDate, site)
    if (kind !== previousKind) {
      seriesHasGood = i === 0 ? seriesHasGoodBefore(localDate, kind, site, rule) : false
      previousKind = kind
    }
    const window = rateAt(localDate, kind, site, rule(localDate, kind))
    if (window.verdict === 'good' && !seriesHasGood) {
      window.startHere = true
      seriesHasGood = true
    }
    windows.push(window)
  }
  return windows
}

/** The window for one local date and kind, rated at `at` when given (e.g. a campaign's fixed clock time). */
export function rateWindow(localDate: string, kind: 'evening' | 'morning', site: ObservingSite, at?: Date): ObservingWindow {
  localDayBounds(localDate, site.timeZone)
  if (kind !== 'evening' && kind !== 'morning') throw new RangeError(`kind must be 'evening' or 'morning'; got ${String(kind)}`)
  if (at !== undefined && !(at instanceof Date && Number.isFinite(at.getTime()))) throw new RangeError('at must be a valid Date')
  const rule = at ? clockTimeRule(site, localDate, at) : twilightRule(site)
  const window = rateAt(localDate, kind, site, at ?? rule(localDate, kind))
  window.startHere = window.verdict === 'good'
    && windowKindOn(localDate, site) === kind
    && !seriesHasGoodBefore(localDate, kind, site, rule)
  return window
}
