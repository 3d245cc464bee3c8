import { describe, expect, it } from 'vitest'
import * as SunCalc from 'suncalc'
import { addLocalDays, eveningWindowStart, morningWindowStart, observingWindows, rateWindow } from '../../shared/observing/windows'
import { localDateTimeOf } from '../../shared/observing/clock'
import { LUNATION_FROM, SITES, siteEntries } from '../support/observing-sites'

const FROM = LUNATION_FROM

describe('observing windows across a whole lunation at four sites', () => {
  for (const [name, site] of siteEntries()) {
    const windows = observingWindows(FROM[name], 30, site)

    it(`${name}: one window a date, in time order, starting at the chosen date`, () => {
      expect(windows).toHaveLength(30)
      expect(windows[0]!.localDate).toBe(FROM[name])
      windows.forEach((w, i) => {
        expect(w.localDate).toBe(addLocalDays(FROM[name], i))
        // Where there is no civil night, the evening before full moon and the morning after it are the same
        // darkest moment of one night.
        if (i > 0 && w.kind === windows[i - 1]!.kind) expect(Date.parse(w.at)).toBeGreaterThan(Date.parse(windows[i - 1]!.at))
        if (i > 0) expect(Date.parse(w.at)).toBeGreaterThanOrEqual(Date.parse(windows[i - 1]!.at))
      })
    })

    it(`${name}: evenings while the Moon waxes, mornings before dawn while it wanes (common practice)`, () => {
      for (const w of windows) {
        const at = new Date(w.at)
        // SunCalc (an independent implementation, after Meeus and the NASA/JPL low-precision formulae) says
        // whether the Moon waxes; a window within half a day of full or new moon may sit either side.
        const illumination = SunCalc.getMoonIllumination(at)
        const nearTurn = Math.min(Math.abs(illumination.phase - 0.5), illumination.phase, 1 - illumination.phase) < 0.02
        if (!nearTurn) expect(w.kind).toBe(illumination.waxing ? 'evening' : 'morning')
        const local = localDateTimeOf(at, site.timeZone)
        // A morning window is before local noon on its own date; an evening window after noon on its date
        // or in the small hours after it.
        if (w.kind === 'morning') {
          expect(local.date).toBe(w.localDate)
          expect(local.time < '12:00').toBe(true)
        }
        else {
          expect([w.localDate, addLocalDays(w.localDate, 1)]).toContain(local.date)
          if (local.date === w.localDate) expect(local.time > '12:00').toBe(true)
        }
      }
      expect(windows.some(w => w.kind === 'evening')).toBe(true)
      expect(windows.some(w => w.kind === 'morning')).toBe(true)
    })

    it(`${name}: rated when the Sun is 6° down, or at the darkest moment where it never gets there`, () => {
      for (const w of windows) {
        const sun = SunCalc.getPosition(new Date(w.at), site.latitude, site.longitude)
        // SunCalc's altitude includes refraction (about half a degree at −6°); it agrees within 0.7°.
        if (name === 'high north in summer') {
          // At 64° N in June the Sun's lowest is 90° − 64.1° − 23.4° ≈ 2.5° below the horizon (common practice:
          // no civil night above about 60.5° N at midsummer): the window is at the Sun's lowest point.
          if (w.localDate < '2026-06-28') {
            const nadir = SunCalc.getTimes(new Date(`${w.localDate}T12:00:00Z`), site.latitude, site.longitude).nadir
            expect(Math.abs(Date.parse(w.at) - nadir.getTime()) % 86_400_000).toBeLessThan(5 * 60_000)
            expect(sun.altitude).toBeGreaterThan(-6)
          }
        }
        else {
          expect(sun.altitude).toBeGreaterThan(-6.7)
          expect(sun.altitude).toBeLessThan(-5.3)
        }
      }
    })

    it(`${name}: the verdict follows the Moon's place (SunCalc within 1° of altitude)`, () => {
      for (const w of windows) {
        const moon = SunCalc.getMoonPosition(new Date(w.at), site.latitude, site.longitude)
        expect(Math.abs(moon.altitude - w.moonAltitudeDeg)).toBeLessThan(1)
        if (w.elongationDeg < 15) expect(w.verdict).toBe('too-close-to-sun')
        else if (moon.altitude < -1) expect(w.verdict).toBe('below-horizon')
        else if (moon.altitude > 6) expect(w.verdict).toBe('good')
      }
    })

    it(`${name}: each series starts at its first good window`, () => {
      for (const kind of ['evening', 'morning'] as const) {
        const runs: typeof windows[] = []
        windows.forEach((w, i) => {
          if (w.kind !== kind) return
          if (i === 0 || windows[i - 1]!.kind !== kind) runs.push([])
          runs[runs.length - 1]!.push(w)
        })
        // The first run may have begun before the chosen date; a later run starts at its first good window.
        for (const run of runs.slice(1)) {
          const firstGood = run.find(w => w.verdict === 'good')
          expect(run.filter(w => w.startHere)).toEqual(firstGood ? [firstGood] : [])
        }
      }
    })
  }

  it('the same window is rated alike alone and in a list', () => {
    const site = SITES['mid-south']
    const windows = observingWindows('2026-11-20', 30, site)
    for (const w of windows.filter((_, i) => i % 5 === 0 || _.startHere)) {
      expect(rateWindow(w.localDate, w.kind, site)).toEqual(w)
    }
  })
})

describe('the waning evening of 2026-12-02 in the south', () => {
  const site = SITES['mid-south']

  it('offers mornings, the first of them good, and nothing before the chosen date', () => {
    // Full moon 2026-11-24 14:53 UTC (astronomy-engine; within a minute of published almanac times), so on
    // 2 December the Moon is a waning gibbous, about 8 days past full: a before-dawn object.
    const windows = observingWindows('2026-12-02', 14, site)
    expect(windows.every(w => w.localDate >= '2026-12-02')).toBe(true)
    expect(windows[0]!.kind).toBe('morning')
    expect(windows[0]!.verdict).toBe('good')
    // New moon 2026-12-09: then the evenings begin, the thin crescent first too close to the Sun.
    const firstEvening = windows.find(w => w.kind === 'evening')!
    expect(firstEvening.localDate >= '2026-12-09').toBe(true)
    expect(windows.filter(w => w.kind === 'evening' && w.startHere)).toHaveLength(1)
  })

  it('morning and evening start instants agree with SunCalc civil dawn and dusk to 2 minutes', () => {
    const times = SunCalc.getTimes(new Date('2026-12-02T12:00:00Z'), site.latitude, site.longitude)
    expect(Math.abs(morningWindowStart('2026-12-02', site).getTime() - times.dawn!.getTime())).toBeLessThan(120_000)
    expect(Math.abs(eveningWindowStart('2026-12-02', site).getTime() - times.dusk!.getTime())).toBeLessThan(120_000)
  })

  it('rates a window at a fixed clock time when asked, and keeps the date and kind', () => {
    const at = new Date('2026-12-03T02:00:00Z') // 04:00 SAST
    const w = rateWindow('2026-12-03', 'morning', site, at)
    expect(w.at).toBe(at.toISOString())
    expect(w.localDate).toBe('2026-12-03')
    expect(w.kind).toBe('morning')
    const moon = SunCalc.getMoonPosition(at, site.latitude, site.longitude)
    expect(Math.abs(moon.altitude - w.moonAltitudeDeg)).toBeLessThan(1)
  })

  it('refuses a bad date, zone, kind or length', () => {
    expect(() => observingWindows('2026-02-30', 14, site)).toThrow(RangeError)
    expect(() => observingWindows('2026-12-02', 14, { ...site, timeZone: 'Mars/Olympus' })).toThrow(RangeError)
    expect(() => observingWindows('2026-12-02', -1, site)).toThrow(RangeError)
    expect(() => rateWindow('2026-12-02', 'noon' as 'evening', site)).toThrow(RangeError)
  })
})
