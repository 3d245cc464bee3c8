// The Moon in the observer's sky: what a campaign should see, cautions, rise and set in local days.

import { describe, expect, it } from 'vitest'
import {
  fixedStarPosition,
  geocentricCircumstances,
  localDateOf,
  localDayBounds,
  lunarCircumstances,
  positionAngleDirection,
  riseSetTransit,
  selenographicToDisk,
  sunCaution,
  terminatorOutline,
  twilight,
} from '../../shared/lunar'
import type { SkyDarkness } from '../../shared/lunar'

const HOUR = 3_600_000
const DAY = 24 * HOUR
const wrap180 = (deg: number) => ((deg % 360) + 540) % 360 - 180

describe('Polaris marks the latitude (common practice)', () => {
  // Polaris, J2000 (Hipparcos): RA 2h31m49.09s, Dec +89°15′50.8″ — recalled from memory. About 0.7° from the
  // pole today, so its altitude stays within a degree of the latitude and it bears within ~1°/cos φ of north.
  const polaris = { raHours: 2 + 31 / 60 + 49.09 / 3600, decDeg: 89 + 15 / 60 + 50.8 / 3600 }

  it('stands at the site\'s latitude, due north, all night and all year', () => {
    for (const latitude of [10, 25, 40, 51.5, 60, 70]) {
      for (const longitude of [-120, -0.1, 77, 151]) {
        for (let i = 0; i < 12; i++) {
          const at = new Date(Date.UTC(2026, 0, 1) + i * 30.6 * DAY + i * 5 * HOUR)
          const p = fixedStarPosition(polaris, at, { latitude, longitude })
          expect(Math.abs(p.altitudeDeg - latitude)).toBeLessThan(1)
          expect(Math.abs(wrap180(p.azimuthDeg))).toBeLessThan(1 / Math.cos(latitude * Math.PI / 180))
        }
      }
    }
  })
})

describe('a lunation campaign at a fixed clock time (common practice)', () => {
  // A class in Phoenix (no daylight saving, so the clock time stays put) observing at 19:15 each evening
  // from the day after the new moon of 2026 March 19 (01:23 UT) to the full moon of April 2.
  const phoenix = { latitude: 33.45, longitude: -112.07, elevation: 340 }
  const zone = 'America/Phoenix'
  const evenings = Array.from({ length: 14 }, (_, i) => {
    const date = new Date(Date.UTC(2026, 2, 19 + i)).toISOString().slice(0, 10)
    const at = new Date(localDayBounds(date, zone).start.getTime() + 19.25 * HOUR)
    return { date, at, moon: lunarCircumstances(at, phoenix), caution: sunCaution(at, phoenix) }
  })

  it('finds the young crescent low in the west a night or two after new moon', () => {
    for (const { moon } of evenings.slice(0, 2)) {
      expect(moon.altitudeDeg).toBeGreaterThan(0)
      expect(moon.altitudeDeg).toBeLessThan(25)
      // "~270–280° for mid-northern sites" with a few degrees of slack for the season.
      expect(moon.azimuthDeg).toBeGreaterThan(265)
      expect(moon.azimuthDeg).toBeLessThan(290)
      expect(moon.phaseName).toBe('waxing-crescent')
    }
  })

  it('sees the azimuth fall every night toward the east-southeast by full moon', () => {
    for (let i = 1; i < evenings.length; i++) {
      expect(evenings[i]!.moon.azimuthDeg).toBeLessThan(evenings[i - 1]!.moon.azimuthDeg)
    }
    const last = evenings.at(-1)!.moon
    expect(last.phaseName).toBe('full')
    expect(last.azimuthDeg).toBeGreaterThan(90)
    expect(last.azimuthDeg).toBeLessThan(110)
  })

  it('sees the altitude first rise and then fall, and the phase grow', () => {
    const altitudes = evenings.map(e => e.moon.altitudeDeg)
    const peak = altitudes.indexOf(Math.max(...altitudes))
    expect(peak).toBeGreaterThan(2)
    expect(peak).toBeLessThan(altitudes.length - 3)
    altitudes.forEach((alt, i) => {
      if (i > 0 && i <= peak) expect(alt).toBeGreaterThan(altitudes[i - 1]!)
      if (i > peak) expect(alt).toBeLessThan(altitudes[i - 1]!)
    })
    const fractions = evenings.map(e => e.moon.illuminatedFraction)
    fractions.slice(1).forEach((k, i) => expect(k).toBeGreaterThan(fractions[i]!))
  })

  it('warns while the Moon is within 15° of the Sun, and not once it is clear', () => {
    expect(evenings.every(e => !e.caution.sunUp)).toBe(true)
    expect(evenings[0]!.caution.moonSunSeparationDeg).toBeLessThan(15)
    expect(evenings[0]!.caution.warn).toBe(true)
    expect(evenings.slice(1).every(e => !e.caution.warn)).toBe(true)
  })

  it('cannot show the Moon for a couple of days around new moon', () => {
    // Common practice: within about a day of new moon the Moon is either below the horizon once the Sun
    // has set (or before it rises) or too close to it (elongation under ~10°) to be seen.
    for (const date of ['2026-03-17', '2026-03-18']) {
      const sunset = riseSetTransit('sun', date, phoenix, zone).set!
      const dusk = new Date(sunset.getTime() + 0.5 * HOUR)
      const moon = lunarCircumstances(dusk, phoenix)
      expect(moon.altitudeDeg < 0 || moon.elongationDeg < 10).toBe(true)
    }
    for (const date of ['2026-03-18', '2026-03-19']) {
      const sunrise = riseSetTransit('sun', date, phoenix, zone).rise!
      const dawn = new Date(sunrise.getTime() - 0.5 * HOUR)
      const moon = lunarCircumstances(dawn, phoenix)
      expect(moon.altitudeDeg < 0 || moon.elongationDeg < 10).toBe(true)
    }
  })
})

describe('the crescent from the two hemispheres', () => {
  it('is mirrored left for right in the zenith-up view, and alike with north up', () => {
    // 2026 June 18, 10:30 UT: the evening crescent seen from 34.7° N and 34.9° S on the same meridian.
    const at = new Date('2026-06-18T10:30:00Z')
    const [north, south] = [34.7, -34.9].map((latitude) => {
      const site = { latitude, longitude: 138.6 }
      const moon = lunarCircumstances(at, site)
      expect(moon.altitudeDeg).toBeGreaterThan(0)
      expect(sunCaution(at, site).sunAltitudeDeg).toBeLessThan(-5)
      return {
        sky: terminatorOutline(moon, { orientation: 'zenith-up', flip: 'none' }).brightLimbDir,
        chart: terminatorOutline(moon, { orientation: 'north-up', flip: 'none' }).brightLimbDir,
      }
    })
    // The lit limb faces the set Sun, below: down and to the right in the north, down and to the left in
    // the south.
    expect(north!.sky.y).toBeLessThan(0)
    expect(south!.sky.y).toBeLessThan(0)
    expect(north!.sky.x).toBeGreaterThan(0.2)
    expect(south!.sky.x).toBeLessThan(-0.2)
    // With celestial north up both see the lit limb toward the west (right).
    expect(north!.chart.x).toBeGreaterThan(0.5)
    expect(south!.chart.x).toBeGreaterThan(0.5)
  })
})

describe('Sun cautions and twilight', () => {
  const london = { latitude: 51.5, longitude: -0.1 }

  it('warns whenever the Sun is up', () => {
    const noon = new Date('2026-06-21T12:00:00Z')
    expect(sunCaution(noon, london)).toMatchObject({ sunUp: true, warn: true })
    expect(twilight(noon, london).darkness).toBe('day')
  })

  it('walks from day to night through the three twilights, changing at sunset', () => {
    const sunset = riseSetTransit('sun', '2026-11-15', london, 'Europe/London').set!
    const order: SkyDarkness[] = ['day', 'civil-twilight', 'nautical-twilight', 'astronomical-twilight', 'night']
    let stage = 0
    for (let minutes = -30; minutes <= 180; minutes += 5) {
      const now = order.indexOf(twilight(new Date(sunset.getTime() + minutes * 60_000), london).darkness)
      expect(now).toBeGreaterThanOrEqual(stage)
      stage = now
    }
    expect(stage).toBe(4)
    expect(twilight(new Date(sunset.getTime() - 2 * 60_000), london).darkness).toBe('day')
    expect(twilight(new Date(sunset.getTime() + 2 * 60_000), london).darkness).toBe('civil-twilight')
  })
})

describe('rise, transit and set within a local calendar day', () => {
  const london = { latitude: 51.5, longitude: -0.1 }

  it('keeps every event inside the local day, including clock-change days', () => {
    for (const date of ['2026-03-28', '2026-03-29', '2026-03-30', '2026-10-24', '2026-10-25', '2026-10-26']) {
      for (const body of ['sun', 'moon'] as const) {
        const events = riseSetTransit(body, date, london, 'Europe/London')
        for (const at of [events.rise, events.transit, events.set]) {
          if (at) expect(localDateOf(at, 'Europe/London')).toBe(date)
        }
      }
    }
  })

  it('moves sunrise by minutes in UT, not by the hour the clocks jump', () => {
    const rise = (date: string) => riseSetTransit('sun', date, london, 'Europe/London').rise!.getTime()
    // Spring forward on 2026-03-29 (23-hour day); fall back on 2026-10-25 (25-hour day).
    expect(Math.abs(rise('2026-03-29') - rise('2026-03-28') - DAY)).toBeLessThan(5 * 60_000)
    expect(Math.abs(rise('2026-10-25') - rise('2026-10-24') - DAY)).toBeLessThan(5 * 60_000)
    expect(localDayBounds('2026-03-29', 'Europe/London').end.getTime()
      - localDayBounds('2026-03-29', 'Europe/London').start.getTime()).toBe(23 * HOUR)
    expect(localDayBounds('2026-10-25', 'Europe/London').end.getTime()
      - localDayBounds('2026-10-25', 'Europe/London').start.getTime()).toBe(25 * HOUR)
  })

  it('puts the Sun\'s transit near local apparent noon', () => {
    // The equation of time stays within ±17 minutes (common practice).
    for (const date of ['2026-02-11', '2026-05-14', '2026-07-26', '2026-11-03']) {
      const transit = riseSetTransit('sun', date, london, 'Europe/London').transit!
      const meanNoon = Date.parse(`${date}T12:00:00Z`) - (london.longitude / 15) * HOUR
      expect(Math.abs(transit.getTime() - meanNoon)).toBeLessThan(17 * 60_000)
    }
  })

  it('skips moonrise on the day the rising slips past midnight', () => {
    // The Moon rises ~50 minutes later each day, so about once a lunation a calendar day has no moonrise:
    // the rising before it is late in the evening and the one after it just past midnight.
    const days = Array.from({ length: 31 }, (_, i) => new Date(Date.UTC(2026, 2, 1 + i)).toISOString().slice(0, 10))
    const missing = days.filter(d => riseSetTransit('moon', d, london, 'Europe/London').rise === null)
    expect(missing.length).toBeGreaterThanOrEqual(1)
    expect(missing.length).toBeLessThanOrEqual(2)
    for (const date of missing) {
      const { start, end } = localDayBounds(date, 'Europe/London')
      const before = riseSetTransit('moon', localDateOf(new Date(start.getTime() - 1), 'Europe/London'), london, 'Europe/London').rise!
      const after = riseSetTransit('moon', localDateOf(end, 'Europe/London'), london, 'Europe/London').rise!
      expect(start.getTime() - before.getTime()).toBeLessThan(2.5 * HOUR)
      expect(after.getTime() - end.getTime()).toBeLessThan(2.5 * HOUR)
    }
  })

  it('starts a day whose midnight the clocks skip at the jump', () => {
    // America/Santiago moved its clocks from 00:00 to 01:00 on 2026-09-06 (per the runtime's zone data):
    // the day starts at the jump. Whatever the rules, the first instant must read the date and the one
    // before it the previous date.
    const { start } = localDayBounds('2026-09-06', 'America/Santiago')
    expect(localDateOf(start, 'America/Santiago')).toBe('2026-09-06')
    expect(localDateOf(new Date(start.getTime() - 1000), 'America/Santiago')).toBe('2026-09-05')
    // Samoa skipped 2011-12-30 altogether when it crossed the date line.
    expect(() => localDayBounds('2011-12-30', 'Pacific/Apia')).toThrow(RangeError)
  })
})

describe('the disk as the site sees it', () => {
  it('shifts the librations by the parallax, toward the site\'s horizon', () => {
    // From the Earth's centre the Moon's centre line meets the Moon at the geocentric librations; the site,
    // one Earth radius nearer its own zenith, looks at a point displaced toward the zenith side of the disk,
    // by the parallax in altitude (≈ 6371 km / distance × cos altitude radians; ~0.95° near the horizon).
    const site = { latitude: 51.5, longitude: -0.1 }
    for (const iso of ['2026-03-22T19:30:00Z', '2026-03-27T02:00:00Z', '2026-04-03T23:00:00Z']) {
      const at = new Date(iso)
      const topo = lunarCircumstances(at, site)
      const geo = geocentricCircumstances(at)
      const northUp = { orientation: 'north-up', flip: 'none' } as const
      const geoCentre = selenographicToDisk(geo.librationLatDeg, geo.librationLonDeg, topo, northUp)!
      const shiftDeg = Math.asin(Math.hypot(geoCentre.x, geoCentre.y)) * 180 / Math.PI
      const parallaxDeg = (6371 / topo.distanceKm) * Math.cos(topo.altitudeDeg * Math.PI / 180) * 180 / Math.PI
      expect(Math.abs(shiftDeg - parallaxDeg)).toBeLessThan(0.05)
      const zenith = positionAngleDirection(topo.parallacticAngleDeg)
      expect((geoCentre.x * zenith.x + geoCentre.y * zenith.y) / Math.hypot(geoCentre.x, geoCentre.y)).toBeLessThan(-0.99)
    }
  })

  it('reports a refracted altitude that puts the upper limb on the horizon at moonrise', () => {
    // Standard refraction lifts the horizon-grazing Moon by about 34′ (common practice), so at the instant
    // of rising the refracted centre sits one semi-diameter below the horizon. The library's rise search uses
    // exactly 34′ while its 'normal' refraction formula (used for altitudeDeg) gives about 37′ at the
    // horizon, hence 0.08° rather than a tighter tolerance; without refraction the error would be 0.6°.
    const site = { latitude: 40.7, longitude: -74.0 }
    for (const date of ['2026-03-05', '2026-03-12', '2026-03-27']) {
      const rise = riseSetTransit('moon', date, site, 'America/New_York').rise!
      const moon = lunarCircumstances(rise, site)
      expect(Math.abs(moon.altitudeDeg + moon.apparentDiameterDeg / 2)).toBeLessThan(0.08)
    }
  })
})
