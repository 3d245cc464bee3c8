// The lunation worksheet's computed side: the predicted sky at one clock time, night by night, and what
// the learner should notice in it. Pure functions, so the page and the tests share them.

import { lunarCircumstances, lunationBounds, type PhaseName } from '../lunar'
import { localDateTimeOf, zonedInstant } from './clock'
import type { ObservingSite } from './night'

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

/**
 * Plain-language notes on the trends, from the predicted nights that find the Moon above the horizon.
 * The statements are those the campaign sets out to show (common practice in teaching the lunation).
 */
export function trendNotes(nights: PredictedNight[], clockTime: string): string[] {
  const up = nights.filter(n => n.altitudeDeg > 0)
  if (up.length < 3) return [`At ${clockTime} the Moon is above the horizon on too few nights of this lunation to see a trend; try an earlier or later clock time.`]
  const notes: string[] = []
  const first = up[0]!
  const last = up[up.length - 1]!
  const westward = first.azimuthDeg > last.azimuthDeg
  notes.push(westward
    ? `At ${clockTime} the Moon's azimuth falls night after night, from about ${Math.round(first.azimuthDeg)}° on ${first.localDate} to ${Math.round(last.azimuthDeg)}° on ${last.localDate}: each evening it stands further east, because it moves about 12° a day eastward along its orbit.`
    : `At ${clockTime} the Moon's azimuth rises from ${Math.round(first.azimuthDeg)}° to ${Math.round(last.azimuthDeg)}° over these nights.`)
  const highest = up.reduce((best, n) => (n.altitudeDeg > best.altitudeDeg ? n : best), first)
  if (highest !== first && highest !== last) {
    notes.push(`Its altitude at that time first rises, to about ${Math.round(highest.altitudeDeg)}° on ${highest.localDate}, then falls as the Moon moves east and rises later each night.`)
  }
  else {
    notes.push(`Its altitude at that time goes from ${Math.round(first.altitudeDeg)}° to ${Math.round(last.altitudeDeg)}°.`)
  }
  notes.push('A compass read the same way every night may be off by a steady few degrees; the compass offset estimate removes that, leaving the night-to-night change.')
  return notes
}
