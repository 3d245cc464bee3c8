import { describe, expect, it } from 'vitest'
import * as SunCalc from 'suncalc'
import { defaultClockTime, proposeCampaign, roundToQuarterHour } from '../../shared/campaigns/propose'
import { OUTLIER_DEG, cellState, compareMembers } from '../../shared/campaigns/progress'
import { CampaignBody } from '../../shared/campaigns/schema'
import { localDateTimeOf } from '../../shared/observing/clock'

// Campaign nights are checked against SunCalc (an independent implementation of the lunar phase and
// position, after Meeus and the JPL approximations) rather than against our own lunar module.
const NORTH = { latitude: 52.634, longitude: -1.692, elevation: 95, timeZone: 'Europe/London' }
const SOUTH = { latitude: -33.93, longitude: 18.47, elevation: 40, timeZone: 'Africa/Johannesburg' }

describe('proposed campaign nights', () => {
  for (const [name, site] of Object.entries({ 'northern site': NORTH, 'southern site': SOUTH })) {
    it(`${name}: an evening campaign proposes only evenings while the Moon waxes, above the horizon and clear of the Sun`, () => {
      const proposal = proposeCampaign('evening', '2026-11-09', 31, site)
      const proposed = proposal.nights.filter(n => n.proposed)
      expect(proposed.length).toBeGreaterThanOrEqual(8)
      for (const n of proposed) {
        const at = new Date(n.at)
        // SunCalc's phase runs 0 (new) → 0.5 (full) → 1: below 0.5 the Moon waxes. The series runs up to the
        // evening of full moon, which may fall a few hours after the instant of full (phase ≤ 0.52, half a day).
        expect(SunCalc.getMoonIllumination(at).phase, n.localDate).toBeLessThan(0.52)
        // SunCalc 2's altitude is in degrees and includes refraction; only the altitude is compared.
        const altitude = SunCalc.getMoonPosition(at, site.latitude, site.longitude).altitude
        expect(altitude, n.localDate).toBeGreaterThan(-1)
        expect(Math.abs(altitude - n.moonAltitudeDeg), n.localDate).toBeLessThan(1.5)
      }
      // One series only: every proposed night lies within the first half of that lunation.
      const days = proposed.map(n => Date.parse(`${n.localDate}T12:00:00Z`))
      expect((Math.max(...days) - Math.min(...days)) / 86_400_000).toBeLessThan(16)
      expect(proposal.clockTime).toMatch(/^\d{2}:(00|15|30|45)$/)
    })

    it(`${name}: a morning campaign proposes only mornings while the Moon wanes, before the Sun rises`, () => {
      const proposal = proposeCampaign('morning', '2026-11-24', 20, site)
      const proposed = proposal.nights.filter(n => n.proposed)
      expect(proposed.length).toBeGreaterThanOrEqual(6)
      for (const n of proposed) {
        const at = new Date(n.at)
        expect(SunCalc.getMoonIllumination(at).phase, n.localDate).toBeGreaterThan(0.5)
        const sunAltitude = SunCalc.getPosition(at, site.latitude, site.longitude).altitude
        // Start of morning civil twilight: the Sun's centre 6° below the horizon (common practice); SunCalc's
        // refraction puts it within about 0.7° of that.
        expect(Math.abs(sunAltitude + 6), n.localDate).toBeLessThan(0.8)
        expect(Number(localDateTimeOf(at, site.timeZone).time.slice(0, 2)), n.localDate).toBeLessThan(9)
      }
    })
  }

  it('the default clock time is the first evening\'s end of civil twilight, to the quarter hour', () => {
    // SunCalc's "dusk" is the end of evening civil twilight (Sun 6° below the horizon).
    const dusk = SunCalc.getTimes(new Date('2026-11-12T12:00:00Z'), NORTH.latitude, NORTH.longitude).dusk!
    const expected = roundToQuarterHour(localDateTimeOf(dusk, NORTH.timeZone).time)
    expect(defaultClockTime('evening', '2026-11-12', NORTH)).toBe(expected)
    expect(roundToQuarterHour('17:07')).toBe('17:00')
    expect(roundToQuarterHour('17:08')).toBe('17:15')
    expect(roundToQuarterHour('23:55')).toBe('00:00')
  })
})

describe('the progress grid\'s cells', () => {
  it('shows the furthest step a member reached', () => {
    expect(cellState(undefined)).toBe('nothing')
    expect(cellState({ measurements: 0, sketchStatuses: [] })).toBe('logged')
    expect(cellState({ measurements: 2, sketchStatuses: [] })).toBe('measured')
    expect(cellState({ measurements: 0, sketchStatuses: ['draft'] })).toBe('sketched')
    expect(cellState({ measurements: 2, sketchStatuses: ['returned'] })).toBe('sketched')
    expect(cellState({ measurements: 2, sketchStatuses: ['submitted'] })).toBe('submitted')
    expect(cellState({ measurements: 0, sketchStatuses: ['draft', 'approved'] })).toBe('published')
  })
})

describe('class comparison', () => {
  it('removes each member\'s constant compass offset before looking for outliers', () => {
    // Worked by hand: residuals −9, −8, −10, −9 average −9°, so after the offset all are within 1°;
    // residuals 2, 3, 31, 4 average 10°, and 31 − 10 = 21° is past the 10° rule of thumb.
    const reading = (localDate: string, residualDeg: number) => ({ localDate, kind: 'azimuth' as const, measuredDeg: 200 + residualDeg, predictedDeg: 200, residualDeg })
    const [steady, slip] = compareMembers([
      { member: { id: 'a', name: 'A' }, readings: [reading('d1', -9), reading('d2', -8), reading('d3', -10), reading('d4', -9)] },
      { member: { id: 'b', name: 'B' }, readings: [reading('d1', 2), reading('d2', 3), reading('d3', 31), reading('d4', 4)] },
    ])
    expect(steady!.compassOffsetDeg).toBeCloseTo(-9, 10)
    expect(steady!.readings.some(r => r.outlier)).toBe(false)
    expect(slip!.compassOffsetDeg).toBeCloseTo(10, 10)
    expect(slip!.readings.map(r => r.outlier)).toEqual([false, false, true, false])
    expect(slip!.readings[2]!.correctedDeg).toBeCloseTo(21, 10)
    expect(OUTLIER_DEG).toBe(10)
  })

  it('keeps altitude residuals as they are: a clinometer reads against gravity', () => {
    const [m] = compareMembers([{ member: { id: 'a', name: 'A' }, readings: [
      { localDate: 'd1', kind: 'altitude', measuredDeg: 32, predictedDeg: 20, residualDeg: 12 },
      { localDate: 'd1', kind: 'azimuth', measuredDeg: 212, predictedDeg: 200, residualDeg: 12 },
    ] }])
    expect(m!.readings[0]!.correctedDeg).toBe(12)
    expect(m!.readings[0]!.outlier).toBe(true)
    expect(m!.readings[1]!.correctedDeg).toBe(0)
    expect(m!.altitudeMeanResidualDeg).toBe(12)
  })
})

describe('campaign input', () => {
  const good = { title: 'Crescent', kind: 'evening', groupSiteId: '00000000-0000-4000-8000-000000000000', nights: ['2026-11-12'], asks: { sketch: true, altitude: false, azimuth: false } }
  it('accepts a campaign and refuses repeated nights, no nights, nothing asked and a bad clock time', () => {
    expect(CampaignBody.safeParse(good).success).toBe(true)
    expect(CampaignBody.safeParse({ ...good, nights: ['2026-11-12', '2026-11-12'] }).success).toBe(false)
    expect(CampaignBody.safeParse({ ...good, nights: [] }).success).toBe(false)
    expect(CampaignBody.safeParse({ ...good, asks: { sketch: false, altitude: false, azimuth: false } }).success).toBe(false)
    expect(CampaignBody.safeParse({ ...good, clockTime: '25:00' }).success).toBe(false)
  })
})
