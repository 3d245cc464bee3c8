// The lunation worksheet's computed side: the predicted sky at one clock time, night by night, and what
// the learner should notice in it. Pure functions, so the page and the tests share them.

import { lunarCircumstances, lunationBounds, type PhaseName } from '../lunar'
import { localDateTimeOf, zonedInstant } from './clock'
import type { ObservingSite } from './night'
import { unwrapDegrees } from './unwrap'

export interface PredictedNight {
  localDate: string
  at: string
  altitudeDeg: number
  azimuthDeg: number
  illuminatedFraction: number
  phaseName: PhaseName
  brightLimbAngleDeg: number
  parallacticAngleDeg: number
  axisAngleDeg: number
  librationLonDeg: number
  librationLatDeg: number
}

/** Each local date from the night after new moon to the last night before the next one. */
export function lunationNights(at: Date, timeZone: string): { dates: string[], previousNewMoon: Date, nextNewMoon: Date } {
  const { previousNewMoon, nextNewMoon } = lunationBounds(at)
  const dates: string[] = []
  let cursor = localDateTimeOf(previousNewMoon, timeZone).date
  const last = localDateTimeOf(nextNewMoon, timeZone).date
  while (cursor <= last) {
    dates.push(cursor)
    const next = new Date(`${cursor}T12:00:00Z`)
    next.setUTCDate(next.getUTCDate() + 1)
    cursor = next.toISOString().slice(0, 10)
  }
  return { dates, previousNewMoon, nextNewMoon }
}

/** Where the Moon stands at the same clock time on each night: the curve the measurements are read against. */
export function predictedAtClockTime(dates: string[], clockTime: string, site: ObservingSite): PredictedNight[] {
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation }
  return dates.map((localDate) => {
    const at = zonedInstant(localDate, clockTime, site.timeZone)
    const c = lunarCircumstances(at, place)
    return {
      localDate,
      at: at.toISOString(),
      altitudeDeg: c.altitudeDeg,
      azimuthDeg: c.azimuthDeg,
      illuminatedFraction: c.illuminatedFraction,
      phaseName: c.phaseName,
      brightLimbAngleDeg: c.brightLimbAngleDeg,
      parallacticAngleDeg: c.parallacticAngleDeg,
      axisAngleDeg: c.axisAngleDeg,
      librationLonDeg: c.librationLonDeg,
      librationLatDeg: c.librationLatDeg,
    }
  })
}

/** The clock time most of the nights were observed at (the median, to the minute). */
export function typicalClockTime(localTimes: string[], fallback = '21:00'): string {
  if (localTimes.length === 0) return fallback
  const minutes = localTimes.map(t => Number(t.slice(0, 2)) * 60 + Number(t.slice(3, 5))).sort((a, b) => a - b)
  const mid = minutes[Math.floor((minutes.length - 1) / 2)]!
  return `${String(Math.floor(mid / 60)).padStart(2, '0')}:${String(mid % 60).padStart(2, '0')}`
}

/** The longest run of consecutive nights with the Moon above the horizon: one stretch of the lunation, so the
 * change is never read across the nights it is down (or across into the next lunation). */
function longestRunUp(nights: PredictedNight[]): PredictedNight[] {
  let best: PredictedNight[] = []
  let run: PredictedNight[] = []
  for (const n of nights) {
    if (n.altitudeDeg > 0) run.push(n)
    else run = []
    if (run.length > best.length) best = [...run]
  }
  return best
}

/**
 * Plain-language notes on the trends, from the longest run of predicted nights that find the Moon above the horizon. Every
 * direction is read from the numbers: the azimuth change is the signed, unwrapped one (355° to 5° is +10°),
 * so a Moon that passes north of the zenith, as seen from the southern hemisphere, reads as rising. The
 * explanation (the Moon moves about 12° a day eastward relative to the Sun, so at a fixed clock time it stands
 * further east each night) is common practice in teaching the lunation, and holds in either hemisphere.
 */
export function trendNotes(nights: PredictedNight[], clockTime: string): string[] {
  const up = longestRunUp(nights)
  if (up.length < 3) return [`At ${clockTime} the Moon is above the horizon on too few nights of this lunation to see a trend; try an earlier or later clock time.`]
  const notes: string[] = []
  const first = up[0]!
  const last = up[up.length - 1]!
  const unwrapped = unwrapDegrees(up.map(n => n.azimuthDeg)) as number[]
  const change = unwrapped[unwrapped.length - 1]! - unwrapped[0]!
  const turnsNorth = Math.floor(Math.max(...unwrapped) / 360) !== Math.floor(Math.min(...unwrapped) / 360)
  const span = `from about ${Math.round(first.azimuthDeg)}° on ${first.localDate} to ${Math.round(last.azimuthDeg)}° on ${last.localDate}`
  const across = turnsNorth ? ', passing through north (360° is 0°)' : ''
  const signed = `${change >= 0 ? '+' : '−'}${Math.abs(Math.round(change))}°`
  notes.push(Math.abs(change) < 1
    ? `At ${clockTime} the Moon's azimuth stays near ${Math.round(first.azimuthDeg)}° over these nights.`
    : `At ${clockTime} the Moon's azimuth ${change < 0 ? 'falls' : 'rises'} night after night, ${span}${across}: ${signed} in all. Each night at that time it stands further east, because it moves about 12° a day eastward relative to the Sun.`)
  const highest = up.reduce((best, n) => (n.altitudeDeg > best.altitudeDeg ? n : best), first)
  const lowest = up.reduce((best, n) => (n.altitudeDeg < best.altitudeDeg ? n : best), first)
  if (highest !== first && highest !== last) {
    notes.push(`Its altitude at that time first rises, to about ${Math.round(highest.altitudeDeg)}° on ${highest.localDate}, then falls.`)
  }
  else if (lowest !== first && lowest !== last) {
    notes.push(`Its altitude at that time first falls, to about ${Math.round(lowest.altitudeDeg)}° on ${lowest.localDate}, then rises.`)
  }
  else {
    const rise = last.altitudeDeg - first.altitudeDeg
    notes.push(`Its altitude at that time ${rise >= 0 ? 'rises' : 'falls'} from ${Math.round(first.altitudeDeg)}° to ${Math.round(last.altitudeDeg)}°.`)
  }
  notes.push('A compass read the same way every night may be off by a steady few degrees; the compass offset estimate removes that, leaving the night-to-night change.')
  return notes
}

export interface SheetRow {
  localDate: string
  predicted: PredictedNight
  /** The observation logged that night, if any (its id). */
  observationId: string | null
}

/**
 * The rows of the printed sheet: every night of the lunation on which the Moon is above the horizon at the
 * clock time, filled where an observation was logged and left blank (to be filled in by hand) where not,
 * and any night logged outside that run.
 */
export function sheetRows(nights: PredictedNight[], logged: { id: string, localDate: string }[]): SheetRow[] {
  const byDate = new Map(logged.map(o => [o.localDate, o.id]))
  return nights
    .filter(n => n.altitudeDeg > 0 || byDate.has(n.localDate))
    .map(n => ({ localDate: n.localDate, predicted: n, observationId: byDate.get(n.localDate) ?? null }))
}
