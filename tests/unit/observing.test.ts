import { describe, expect, it } from 'vitest'
import { localDateTimeOf, utcOffsetHours, zonedInstant } from '../../shared/observing/clock'
import { altitudeMeasurement, angleDifference, azimuthMeasurement, estimateConstantOffset } from '../../shared/observing/measurements'
import { describeInstrument, effectiveMagnification, templateFlip } from '../../shared/observing/instrument'
import { lunationNights, predictedAtClockTime, trendNotes, typicalClockTime } from '../../shared/observing/worksheet'
import { lunationEvenings } from '../../shared/observing/tonight'
import { magneticDeclination, phaseNameAt } from '../../shared/lunar'

// An invented mid-northern site for the computed checks.
const FIELD = { latitude: 52.634, longitude: -1.692, elevation: 95, timeZone: 'Europe/London' }

describe('site clock', () => {
  // UK clocks go forward at 01:00 UTC on the last Sunday of March and back at 01:00 UTC on the last
  // Sunday of October (common practice; the zone rules in the runtime's tz database).
  it('turns a local time into UTC in winter and in summer', () => {
    expect(zonedInstant('2026-01-15', '19:30', 'Europe/London').toISOString()).toBe('2026-01-15T19:30:00.000Z')
    expect(zonedInstant('2026-07-15', '21:30', 'Europe/London').toISOString()).toBe('2026-07-15T20:30:00.000Z')
    expect(zonedInstant('2026-07-15', '21:30', 'Africa/Johannesburg').toISOString()).toBe('2026-07-15T19:30:00.000Z')
  })

  it('refuses a time the clocks skip and takes the first of a repeated hour', () => {
    expect(() => zonedInstant('2026-03-29', '01:30', 'Europe/London')).toThrow(RangeError)
    expect(zonedInstant('2026-10-25', '01:30', 'Europe/London').toISOString()).toBe('2026-10-25T00:30:00.000Z')
  })

  it('reads an instant back as the site clock shows it', () => {
    const at = new Date('2026-11-18T18:30:00Z')
    expect(localDateTimeOf(at, 'Europe/London')).toEqual({ date: '2026-11-18', time: '18:30' })
    expect(localDateTimeOf(at, 'Pacific/Auckland')).toEqual({ date: '2026-11-19', time: '07:30' })
    expect(utcOffsetHours(at, 'Pacific/Auckland')).toBe(13)
  })

  it('refuses nonsense dates and zones', () => {
    expect(() => zonedInstant('2026-02-30', '20:00', 'Europe/London')).toThrow(RangeError)
    expect(() => zonedInstant('2026-02-10', '25:00', 'Europe/London')).toThrow(RangeError)
    expect(() => zonedInstant('2026-02-10', '20:00', 'Mars/Olympus')).toThrow(RangeError)
  })
})

describe('measured against predicted', () => {
  it('turns clinometer readings into altitudes (common practice: readings 40°, 30°, 109° give 50°, 60°, 19°)', () => {
    expect([40, 30, 109].map(r => altitudeMeasurement(r, 0).derivedDeg)).toEqual([50, 60, 19])
    expect(altitudeMeasurement(40, 48.5).residualDeg).toBeCloseTo(1.5, 10)
  })

  it('corrects a compass bearing by the declination and folds the azimuth residual across north', () => {
    const at = new Date('2026-11-18T18:30:00Z')
    const m = azimuthMeasurement(358, FIELD, at, 1)
    const declination = magneticDeclination(FIELD, at)
    expect(m.declinationDeg).toBe(declination)
    expect(m.derivedDeg).toBeCloseTo((358 + declination + 360) % 360, 10)
    // 358° + about 0.6° against 1° is about −2.4°, never +357.6°.
    expect(m.residualDeg).toBeCloseTo(358 + declination - 361, 10)
    expect(angleDifference(1, 359)).toBe(2)
    expect(angleDifference(359, 1)).toBe(-2)
    expect(angleDifference(180, 0)).toBe(-180)
  })

  it('finds a known constant compass offset in an invented series and removes it', () => {
    // Invented series: a steady +4° bias plus reading scatter that sums to zero.
    const scatter = [-1, 1.5, -0.5, 0.5, -1.5, 1]
    const estimate = estimateConstantOffset(scatter.map(s => 4 + s))!
    expect(estimate.offsetDeg).toBeCloseTo(4, 12)
    expect(estimate.count).toBe(6)
    // Sample standard deviation of the scatter: sqrt(sum s² / (n − 1)) = sqrt(7 / 5).
    expect(estimate.spreadDeg).toBeCloseTo(Math.sqrt(7 / 5), 12)
    estimate.corrected.forEach((c, i) => expect(c).toBeCloseTo(scatter[i]!, 12))
    expect(estimateConstantOffset([])).toBeNull()
    expect(estimateConstantOffset([3])!.spreadDeg).toBeNull()
  })
})

describe('instruments', () => {
  it('describes them and works out a telescope magnification from focal lengths (common practice: f / eyepiece)', () => {
    const scope = { kind: 'telescope' as const, magnification: null, apertureMm: 114, focalLengthMm: 900, eyepieceMm: 25 }
    expect(effectiveMagnification(scope)).toBe(36)
    expect(describeInstrument(scope)).toBe('Telescope 114 mm, f 900 mm, 25 mm eyepiece, 36×')
    expect(describeInstrument({ kind: 'binoculars', magnification: 10, apertureMm: 42, focalLengthMm: null, eyepieceMm: null })).toBe('Binoculars 10 × 42')
    expect(templateFlip('upright')).toBe('none')
    expect(templateFlip('mirrored')).toBe('mirrored')
  })
})

describe('the lunation worksheet', () => {
  it('takes the median clock time of the nights', () => {
    expect(typicalClockTime(['18:30', '19:10', '18:45'])).toBe('18:45')
    expect(typicalClockTime(['21:00', '20:00'])).toBe('20:00')
    expect(typicalClockTime([])).toBe('21:00')
  })

  it('covers new moon to new moon, one local date a night', () => {
    const { dates, previousNewMoon, nextNewMoon } = lunationNights(new Date('2026-11-18T18:30:00Z'), 'Europe/London')
    // A synodic month is 29.3 to 29.8 days, so 30 or 31 local dates (common practice).
    expect(dates.length).toBeGreaterThanOrEqual(30)
    expect(dates.length).toBeLessThanOrEqual(31)
    expect(dates[0]).toBe(previousNewMoon.toISOString().slice(0, 10))
    expect(dates.at(-1)).toBe(nextNewMoon.toISOString().slice(0, 10))
  })

  it('tells a learner that the azimuth falls and the altitude rises then falls (common practice)', () => {
    const { dates } = lunationNights(new Date('2026-11-18T18:30:00Z'), FIELD.timeZone)
    const nights = predictedAtClockTime(dates, '18:30', FIELD)
    const up = nights.filter(n => n.altitudeDeg > 0)
    for (let i = 1; i < up.length; i += 1) expect(up[i]!.azimuthDeg).toBeLessThan(up[i - 1]!.azimuthDeg)
    const notes = trendNotes(nights, '18:30')
    expect(notes[0]).toMatch(/azimuth falls night after night/)
    expect(notes[1]).toMatch(/first rises.*then falls/)
  })
})

describe('the evenings of a lunation', () => {
  it('rules out the evenings at new moon and starts the series on the first well-placed crescent', () => {
    const evenings = lunationEvenings(new Date('2026-11-16T17:00:00Z'), FIELD)
    expect(evenings[0]!.verdict).not.toBe('good')
    const start = evenings.filter(e => e.startHere)
    expect(start).toHaveLength(1)
    // The young crescent is worth seeking a night or two after new moon, not weeks later (common practice).
    expect(start[0]!.elongationDeg).toBeGreaterThan(15)
    expect(evenings.indexOf(start[0]!)).toBeLessThanOrEqual(5)
    expect(evenings.slice(0, evenings.indexOf(start[0]!)).every(e => e.verdict !== 'good')).toBe(true)
  })
})

describe('the phase at an instant', () => {
  it('names the phases around a published lunation (new moon 2024-04-08 18:21 UTC, from memory of the almanac)', () => {
    expect(phaseNameAt(new Date('2024-04-08T18:21:00Z'))).toBe('new')
    expect(phaseNameAt(new Date('2024-04-11T18:00:00Z'))).toBe('waxing-crescent')
    // First quarter about 7.4 days on, full about 14.8 days on (common practice: a quarter of a 29.53-day month).
    expect(phaseNameAt(new Date('2024-04-16T06:00:00Z'))).toBe('first-quarter')
    expect(phaseNameAt(new Date('2024-04-23T18:00:00Z'))).toBe('full')
    expect(phaseNameAt(new Date('2024-04-28T00:00:00Z'))).toBe('waning-gibbous')
  })
})
