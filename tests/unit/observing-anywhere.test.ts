import { describe, expect, it } from 'vitest'
import * as SunCalc from 'suncalc'
import { cautionsFor, situationOf } from '../../shared/observing/cautions'
import { localDateTimeOf, zonedInstant } from '../../shared/observing/clock'
import { clockOnNight } from '../../shared/observing/format'
import { moonPass } from '../../shared/observing/moonpass'
import { computeNight } from '../../shared/observing/night'
import { plausibilityWarnings } from '../../shared/observing/plausibility'
import { planNight } from '../../shared/observing/tonight'
import { unwrapDegrees } from '../../shared/observing/unwrap'
import { eveningWindowStart, observingWindows } from '../../shared/observing/windows'
import { lunationNights, predictedAtClockTime, sheetRows, trendNotes } from '../../shared/observing/worksheet'
import { lunarCircumstances, sunCaution } from '../../shared/lunar'
import { LUNATION_FROM, SITES, siteEntries } from '../support/observing-sites'

const HOUR = 3_600_000
const addDays = (date: string, n: number) => new Date(Date.parse(`${date}T12:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10)

/** SunCalc's Moon altitude (an independent implementation; geocentric, with refraction: within about 1° of the topocentric one). */
const sunCalcMoonAlt = (at: Date, site: { latitude: number, longitude: number }) => SunCalc.getMoonPosition(at, site.latitude, site.longitude).altitude

describe('moonrise, transit and moonset as the observer means them, four sites, a whole lunation', () => {
  for (const [name, site] of siteEntries()) {
    it(`${name}: the pass under way at nightfall, or the next one; never an event of the night before`, () => {
      for (let i = 0; i < 30; i++) {
        const date = addDays(LUNATION_FROM[name], i)
        const at = eveningWindowStart(date, site)
        const pass = moonPass(at, site)
        const altitude = sunCalcMoonAlt(at, site)
        // Up or down agrees with SunCalc away from the horizon.
        if (Math.abs(altitude) > 1.5) expect(pass.upAt).toBe(altitude > 0)
        const rise = pass.rise ? Date.parse(pass.rise) : null
        const set = pass.set ? Date.parse(pass.set) : null
        if (pass.upAt) {
          if (rise !== null) expect(rise).toBeLessThan(at.getTime())
          if (set !== null) expect(set).toBeGreaterThan(at.getTime())
        }
        else {
          if (rise === null) {
            // At 64° N a Moon south of −26° declination never rises: SunCalc has it down all the next two days.
            for (let h = 0; h <= 48; h += 2) expect(sunCalcMoonAlt(new Date(at.getTime() + h * HOUR), site)).toBeLessThan(1)
          }
          else {
            expect(rise).toBeGreaterThan(at.getTime())
            if (set !== null) expect(set).toBeGreaterThan(rise)
          }
        }
        // SunCalc puts the Moon on the horizon (within its ~1° and the upper-limb rule) at both events.
        if (rise !== null) expect(Math.abs(sunCalcMoonAlt(new Date(rise), site))).toBeLessThan(1.5)
        if (set !== null) expect(Math.abs(sunCalcMoonAlt(new Date(set), site))).toBeLessThan(1.5)
        // The transit lies between them: the Moon is highest there (SunCalc, an hour either side).
        if (pass.transit && rise !== null && set !== null) {
          const t = Date.parse(pass.transit)
          expect(t).toBeGreaterThan(rise)
          expect(t).toBeLessThan(set)
          expect(sunCalcMoonAlt(new Date(t), site)).toBeGreaterThan(sunCalcMoonAlt(new Date(t - HOUR), site) - 0.2)
          expect(sunCalcMoonAlt(new Date(t), site)).toBeGreaterThan(sunCalcMoonAlt(new Date(t + HOUR), site) - 0.2)
        }
      }
    })
  }

  it('an observation at 21:00 on a waxing evening shows the coming moonset, not the morning\'s', () => {
    // Mid-north, every evening of a lunation at 21:00: the stored set is always after the instant, the stored
    // rise before it when the Moon is up and after it when it is down.
    const site = SITES['mid-north']
    for (let i = 0; i < 30; i++) {
      const at = zonedInstant(addDays('2026-11-20', i), '21:00', site.timeZone)
      const night = computeNight(at, site)
      if (night.moon.set) expect(Date.parse(night.moon.set)).toBeGreaterThan(at.getTime())
      if (night.altitudeDeg > 0 && night.moon.rise) expect(Date.parse(night.moon.rise)).toBeLessThan(at.getTime())
      if (night.altitudeDeg < 0 && night.moon.rise) expect(Date.parse(night.moon.rise)).toBeGreaterThan(at.getTime())
    }
  })

  it('reads times against the night: "this morning", "next morning"', () => {
    const zone = 'Africa/Johannesburg'
    expect(clockOnNight('2026-12-02T18:40:00Z', zone, '2026-12-02')).toBe('20:40')
    expect(clockOnNight('2026-12-02T08:10:00Z', zone, '2026-12-02')).toBe('10:10 this morning')
    expect(clockOnNight('2026-12-02T22:30:00Z', zone, '2026-12-02')).toBe('00:30 next morning')
    expect(clockOnNight('2026-12-03T12:00:00Z', zone, '2026-12-02')).toBe('14:00 the day after')
    expect(clockOnNight(null, zone, '2026-12-02')).toBe('—')
  })
})

describe('Tonight on the waning evening of 2026-12-02 near 34° S, 18° E', () => {
  const site = SITES['mid-south']
  const plan = planNight('2026-12-02', site)

  it('gives the next moonrise after nightfall, not the morning\'s, and draws the disk when the Moon is up', () => {
    // About 8 days past full (full moon 2026-11-24, astronomy-engine): the Moon rises late in the evening
    // and is best seen before dawn (common practice).
    expect(plan.moon.upAt).toBe(false)
    expect(Date.parse(plan.moon.rise!)).toBeGreaterThan(Date.parse(plan.nightfall))
    expect(sunCalcMoonAlt(new Date(plan.nightfall), site)).toBeLessThan(0)
    expect(plan.drawn.reason).toBe('later')
    expect(plan.circumstances.altitudeDeg).toBeGreaterThan(5)
    expect(sunCalcMoonAlt(new Date(plan.at), site)).toBeGreaterThan(4)
    // …and before the next dawn.
    expect(Date.parse(plan.at)).toBeLessThan(Date.parse(plan.dawn))
  })

  it('lists only windows on or after the chosen date, mornings first, and steps a lunation either way', () => {
    expect(plan.windows).toHaveLength(14)
    // From the night of the 2nd on: its own morning (the 3rd, before dawn) first, nothing earlier.
    expect(plan.windows.every(w => Date.parse(w.at) > Date.parse(plan.nightfall) - 12 * HOUR)).toBe(true)
    expect(plan.windows[0]).toMatchObject({ localDate: '2026-12-03', kind: 'morning' })
    expect(plan.lunationStep.previous).toBe('2026-11-02')
    expect(plan.lunationStep.next).toBe('2027-01-01')
  })

  it('samples the whole night, to the next dawn, so the chart shows the Moon once it rises', () => {
    const last = plan.samples[plan.samples.length - 1]!
    expect(Date.parse(last.at)).toBeGreaterThanOrEqual(Date.parse(plan.dawn))
    expect(plan.samples.some(s => s.moonAltitudeDeg > 20)).toBe(true)
  })
})

describe('the drawn moment at four sites across a lunation', () => {
  for (const [name, site] of siteEntries()) {
    it(`${name}: the disk is drawn for a moment the Moon is up, or the plan says it is not up at all`, () => {
      for (let i = 0; i < 30; i += 3) {
        const plan = planNight(addDays(LUNATION_FROM[name], i), site)
        if (plan.drawn.reason === 'down') {
          // Then no dark sample has the Moon up.
          const dark = plan.samples.filter(s => Date.parse(s.at) >= Date.parse(plan.nightfall) && Date.parse(s.at) <= Date.parse(plan.dawn))
          expect(dark.every(s => s.moonAltitudeDeg <= 0)).toBe(true)
        }
        else {
          expect(plan.circumstances.altitudeDeg).toBeGreaterThan(0)
        }
      }
    })
  }
})

describe('trend notes read from the signed, unwrapped change', () => {
  it('unwraps azimuths across north', () => {
    expect(unwrapDegrees([350, 355, 5, 10])).toEqual([-10, -5, 5, 10])
    expect(unwrapDegrees([10, 5, null, 355, 350])).toEqual([10, 5, null, -5, -10])
    expect(unwrapDegrees([170, 190, 200])).toEqual([170, 190, 200])
    expect(unwrapDegrees([241, 300, 355, 15])).toEqual([241, 300, 355, 375])
  })

  for (const [name, site] of siteEntries()) {
    for (const clockTime of ['20:30', '05:00']) {
      it(`${name} at ${clockTime}: the verb and the figure agree with SunCalc's azimuths`, () => {
        const { dates } = lunationNights(new Date(`${LUNATION_FROM[name]}T12:00:00Z`), site.timeZone)
        const nights = predictedAtClockTime(dates, clockTime, site)
        const notes = trendNotes(nights, clockTime)
        // The longest run of consecutive nights with the Moon up, as the notes read it.
        const runs: (typeof nights)[] = [[]]
        for (const n of nights) {
          if (n.altitudeDeg > 0) runs[runs.length - 1]!.push(n)
          else runs.push([])
        }
        const up = runs.reduce((a, b) => (b.length > a.length ? b : a))
        if (up.length < 3) {
          expect(notes[0]).toMatch(/too few nights/)
          return
        }
        // SunCalc azimuths (north-based in v2) at the same instants, unwrapped night to night.
        const reference = unwrapDegrees(up.map(n => SunCalc.getMoonPosition(new Date(n.at), site.latitude, site.longitude).azimuth)) as number[]
        const change = reference[reference.length - 1]! - reference[0]!
        const stated = /azimuth (rises|falls) night after night.*: ([+−])(\d+)° in all/.exec(notes[0]!)
        expect(stated, notes[0]).not.toBeNull()
        expect(stated![1]).toBe(change > 0 ? 'rises' : 'falls')
        expect(Math.abs(Number(stated![3]) * (stated![2] === '−' ? -1 : 1) - change)).toBeLessThan(3)
      })
    }
  }

  it('mid-south, evenings: the azimuth rises through north, and the text says so (issue case)', () => {
    const site = SITES['mid-south']
    const { dates } = lunationNights(new Date('2026-11-12T12:00:00Z'), site.timeZone)
    const notes = trendNotes(predictedAtClockTime(dates, '20:30', site), '20:30')
    // Seen from the south the Moon culminates in the north: at a fixed evening time it walks from the west
    // through north towards the east, azimuth increasing through 360° (common practice).
    expect(notes[0]).toMatch(/rises night after night/)
    expect(notes[0]).toMatch(/passing through north/)
  })
})

describe('cautions chosen by the situation', () => {
  const kinds = (at: Date, site: (typeof SITES)[keyof typeof SITES], apertureMm?: number) => {
    const c = lunarCircumstances(at, site)
    const s = sunCaution(at, site)
    const hour = Number(localDateTimeOf(at, site.timeZone).time.slice(0, 2))
    return cautionsFor(situationOf({ ...s, illuminatedFraction: c.illuminatedFraction, waxing: c.waxing }, hour, apertureMm)).map(x => x.kind)
  }

  it('no "thin evening crescent" on a waning day or at 14:00 beside a 61 %-lit Moon; the Sun-up caution instead', () => {
    const site = SITES['mid-south']
    // 2026-11-30 14:00 SAST: the Sun is up, the Moon about 58 % lit and waning (SunCalc).
    const at = zonedInstant('2026-11-30', '14:00', site.timeZone)
    const illum = SunCalc.getMoonIllumination(at)
    expect(illum.waxing).toBe(false)
    expect(illum.fraction).toBeGreaterThan(0.5)
    const list = kinds(at, site)
    expect(list).toContain('sun-up')
    expect(list).not.toContain('evening-crescent')
    expect(list).not.toContain('morning-crescent')
    expect(list).not.toContain('night-outdoors')
  })

  it('a thin morning crescent before dawn gets the morning caution, a thin evening crescent the evening one', () => {
    const site = SITES['mid-north']
    // Waning crescent two or three days before the new moon of 2026-12-09; waxing crescent two or three after.
    const morning = observingWindows('2026-12-06', 1, site)[0]!
    expect(morning.kind).toBe('morning')
    expect(SunCalc.getMoonIllumination(new Date(morning.at)).fraction).toBeLessThan(0.25)
    expect(kinds(new Date(morning.at), site)).toContain('morning-crescent')
    expect(kinds(new Date(morning.at), site)).not.toContain('evening-crescent')
    const evening = observingWindows('2026-12-12', 1, site)[0]!
    expect(evening.kind).toBe('evening')
    expect(kinds(new Date(evening.at), site)).toContain('evening-crescent')
    expect(kinds(new Date(evening.at), site)).toContain('night-outdoors')
  })

  it('the bright-Moon caution comes with a large aperture or an unknown one, not with small binoculars', () => {
    const site = SITES['near the equator']
    const at = new Date(planNight('2026-11-24', site).at) // full moon night
    expect(kinds(at, site, 200)).toContain('bright-moon')
    expect(kinds(at, site)).toContain('bright-moon')
    expect(kinds(at, site, 42)).not.toContain('bright-moon')
  })

  it('the Moon within 15° of the Sun is urgent whatever the hour', () => {
    const list = cautionsFor({ sunAltitudeDeg: -8, moonSunSeparationDeg: 12, illuminatedFraction: 0.02, waxing: true, evening: true })
    expect(list[0]).toMatchObject({ kind: 'sun-near', urgent: true })
  })
})

describe('the printed sheet\'s rows', () => {
  it('has a row for every night the Moon is up at the clock time, filled where logged, blank where still to come', () => {
    const site = SITES['mid-south']
    const { dates } = lunationNights(new Date('2026-11-12T12:00:00Z'), site.timeZone)
    const nights = predictedAtClockTime(dates, '20:30', site)
    const rows = sheetRows(nights, [{ id: 'a', localDate: '2026-11-12' }, { id: 'b', localDate: '2026-12-01' }])
    // 2026-12-01 at 20:30 the waning Moon is still below the horizon, yet it was logged (a cloud-out note, say).
    expect(rows.find(r => r.localDate === '2026-12-01')?.observationId).toBe('b')
    expect(rows.find(r => r.localDate === '2026-11-12')?.observationId).toBe('a')
    const blank = rows.filter(r => r.observationId === null)
    expect(blank.length).toBeGreaterThan(10)
    expect(blank.every(r => r.predicted.altitudeDeg > 0)).toBe(true)
  })
})

describe('plausibility of an observation\'s time', () => {
  it('warns (not refuses) when the Moon is below the horizon, or the time is still to come', () => {
    const site = SITES['mid-south']
    // 2026-12-02 20:00 SAST: the waning Moon has not yet risen (SunCalc below −10°).
    const at = zonedInstant('2026-12-02', '20:00', site.timeZone)
    expect(sunCalcMoonAlt(at, site)).toBeLessThan(-10)
    const night = computeNight(at, site)
    const now = new Date('2026-12-03T12:00:00Z')
    expect(plausibilityWarnings(at, night.altitudeDeg, now).map(w => w.kind)).toEqual(['below-horizon'])
    expect(plausibilityWarnings(at, night.altitudeDeg, now)[0]!.text).toMatch(/below the horizon/)
    // The same night at 04:00 the next morning, logged a day early: the Moon is up, the time is to come.
    const morning = zonedInstant('2026-12-03', '04:00', site.timeZone)
    expect(sunCalcMoonAlt(morning, site)).toBeGreaterThan(10)
    expect(plausibilityWarnings(morning, computeNight(morning, site).altitudeDeg, new Date('2026-12-02T12:00:00Z')).map(w => w.kind)).toEqual(['future'])
    expect(plausibilityWarnings(morning, computeNight(morning, site).altitudeDeg, now)).toEqual([])
  })
})
