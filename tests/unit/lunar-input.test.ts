// Bad input is refused with a RangeError that names the field; good input never yields NaN.

import { describe, expect, it } from 'vitest'
import {
  clinometerToAltitude,
  diskToSelenographic,
  fixedStarPosition,
  geocentricCircumstances,
  lunarCircumstances,
  lunationBounds,
  magneticToTrueAzimuth,
  phaseEvents,
  riseSetTransit,
  selenographicToDisk,
  sunCaution,
  terminatorOutline,
  twilight,
} from '../../shared/lunar'
import type { DiskView, LunarCircumstances, Site } from '../../shared/lunar'

const at = new Date('2026-03-14T20:30:00Z')
const london: Site = { latitude: 51.5, longitude: -0.1, elevation: 30 }
const northUp: DiskView = { orientation: 'north-up', flip: 'none' }

// Calls made the way untyped callers (forms, JSON bodies) make them.
const loose = <T>(value: unknown) => value as T

function refuses(call: () => unknown, field: string) {
  expect(call).toThrow(RangeError)
  expect(call).toThrow(field)
}

describe('bad input', () => {
  it('refuses bad instants', () => {
    refuses(() => lunarCircumstances(new Date('not a date'), london), 'at')
    refuses(() => lunarCircumstances(loose<Date>('2026-03-14T20:30:00Z'), london), 'at')
    refuses(() => lunarCircumstances(loose<Date>(1773520200000), london), 'at')
    refuses(() => lunarCircumstances(new Date('0900-01-01T00:00:00Z'), london), 'at')
    refuses(() => geocentricCircumstances(new Date(Number.NaN)), 'at')
    refuses(() => lunationBounds(new Date(Number.NaN)), 'at')
    refuses(() => phaseEvents(new Date(Number.NaN), at), 'from')
    refuses(() => phaseEvents(at, new Date(Number.NaN)), 'to')
    refuses(() => phaseEvents(at, new Date('2026-01-01T00:00:00Z')), 'to')
  })

  it('refuses bad sites', () => {
    refuses(() => lunarCircumstances(at, { latitude: 90.5, longitude: 0 }), 'site.latitude')
    refuses(() => lunarCircumstances(at, { latitude: -91, longitude: 0 }), 'site.latitude')
    refuses(() => lunarCircumstances(at, { latitude: 10, longitude: 180.01 }), 'site.longitude')
    refuses(() => lunarCircumstances(at, { latitude: 10, longitude: -200 }), 'site.longitude')
    refuses(() => lunarCircumstances(at, loose<Site>({ latitude: '51.5', longitude: 0 })), 'site.latitude')
    refuses(() => lunarCircumstances(at, { latitude: Number.NaN, longitude: 0 }), 'site.latitude')
    refuses(() => lunarCircumstances(at, { latitude: 10, longitude: Number.POSITIVE_INFINITY }), 'site.longitude')
    refuses(() => lunarCircumstances(at, loose<Site>({ latitude: 10 })), 'site.longitude')
    refuses(() => lunarCircumstances(at, { latitude: 10, longitude: 0, elevation: 10_001 }), 'site.elevation')
    refuses(() => lunarCircumstances(at, { latitude: 10, longitude: 0, elevation: -501 }), 'site.elevation')
    refuses(() => lunarCircumstances(at, loose<Site>(null)), 'site')
    refuses(() => sunCaution(at, { latitude: 100, longitude: 0 }), 'site.latitude')
    refuses(() => twilight(at, { latitude: 0, longitude: 400 }), 'site.longitude')
  })

  it('refuses bad local dates, time zones and bodies', () => {
    refuses(() => riseSetTransit('moon', '2026-02-30', london, 'Europe/London'), 'localDate')
    refuses(() => riseSetTransit('moon', '2026-3-1', london, 'Europe/London'), 'localDate')
    refuses(() => riseSetTransit('moon', loose<string>(20260301), london, 'Europe/London'), 'localDate')
    refuses(() => riseSetTransit('moon', '2026-03-01', london, 'Mars/Olympus_Mons'), 'timeZone')
    refuses(() => riseSetTransit('moon', '2026-03-01', london, ''), 'timeZone')
    refuses(() => riseSetTransit(loose<'moon'>('venus'), '2026-03-01', london, 'Europe/London'), 'body')
    refuses(() => riseSetTransit('sun', '2026-03-01', { latitude: 95, longitude: 0 }, 'UTC'), 'site.latitude')
  })

  it('refuses bad disk input', () => {
    const moon = lunarCircumstances(at, london)
    refuses(() => diskToSelenographic(Number.NaN, 0, moon, northUp), 'x')
    refuses(() => diskToSelenographic(0, loose<number>('0'), moon, northUp), 'y')
    refuses(() => selenographicToDisk(91, 0, moon, northUp), 'lat')
    refuses(() => selenographicToDisk(0, 181, moon, northUp), 'lon')
    refuses(() => terminatorOutline(moon, loose<DiskView>({ orientation: 'south-up', flip: 'none' })), 'view.orientation')
    refuses(() => terminatorOutline(moon, loose<DiskView>({ orientation: 'north-up', flip: 'sideways' })), 'view.flip')
    refuses(() => terminatorOutline({ ...moon, illuminatedFraction: 1.2 }, northUp), 'circumstances.illuminatedFraction')
    refuses(() => terminatorOutline(loose<LunarCircumstances>({}), northUp), 'circumstances')
  })

  it('refuses bad measurements', () => {
    refuses(() => clinometerToAltitude(-1), 'protractorReadingDeg')
    refuses(() => clinometerToAltitude(181), 'protractorReadingDeg')
    refuses(() => clinometerToAltitude(Number.NaN), 'protractorReadingDeg')
    refuses(() => magneticToTrueAzimuth(361, london, at), 'compassBearingDeg')
    refuses(() => magneticToTrueAzimuth(10, london, new Date('x')), 'at')
    refuses(() => fixedStarPosition({ raHours: 25, decDeg: 0 }, at, london), 'star.raHours')
  })
})

describe('good input at the edges', () => {
  const edges: Site[] = [
    { latitude: 90, longitude: 0 },
    { latitude: -90, longitude: 0 },
    { latitude: 0, longitude: 180 },
    { latitude: 0, longitude: -180 },
    { latitude: 89.999, longitude: 179.999, elevation: 10_000 },
    { latitude: -45, longitude: 0, elevation: -500 },
  ]

  it('never answers NaN and stays plain JSON', () => {
    for (const site of edges) {
      for (let i = 0; i < 10; i++) {
        const when = new Date(Date.UTC(2026, 0, 1) + i * 3.3e8)
        const moon = lunarCircumstances(when, site)
        for (const value of Object.values(moon)) {
          if (typeof value === 'number') expect(Number.isFinite(value)).toBe(true)
        }
        expect(JSON.parse(JSON.stringify(moon))).toEqual(moon)
        const outline = terminatorOutline(moon, { orientation: 'zenith-up', flip: 'mirrored' })
        expect(outline.litPath.every(p => Number.isFinite(p.x) && Number.isFinite(p.y))).toBe(true)
        expect(Number.isFinite(magneticToTrueAzimuth(123, site, when))).toBe(true)
        const events = riseSetTransit('moon', when.toISOString().slice(0, 10), site, 'UTC')
        for (const event of Object.values(events)) {
          if (event) expect(Number.isFinite(event.getTime())).toBe(true)
        }
      }
    }
  })

  it('keeps each value in its documented range', () => {
    for (let i = 0; i < 200; i++) {
      const moon = lunarCircumstances(new Date(Date.UTC(2026, 0, 1) + i * 1.7e8), { latitude: 40 * Math.sin(i), longitude: 170 * Math.cos(i * 1.3) })
      expect(moon.illuminatedFraction).toBeGreaterThanOrEqual(0)
      expect(moon.illuminatedFraction).toBeLessThanOrEqual(1)
      expect(moon.elongationDeg).toBeGreaterThanOrEqual(0)
      expect(moon.elongationDeg).toBeLessThanOrEqual(180)
      for (const angle of [moon.brightLimbAngleDeg, moon.colongitudeDeg, moon.azimuthDeg]) {
        expect(angle).toBeGreaterThanOrEqual(0)
        expect(angle).toBeLessThan(360)
      }
      expect(Math.abs(moon.axisAngleDeg)).toBeLessThan(28)
      expect(Math.abs(moon.librationLonDeg)).toBeLessThan(9.5)
      expect(Math.abs(moon.librationLatDeg)).toBeLessThan(8)
      expect(Math.abs(moon.subSolarLatDeg)).toBeLessThan(1.8)
      expect(moon.ageDays).toBeGreaterThanOrEqual(0)
      expect(moon.ageDays).toBeLessThan(29.9)
      // Perigee 356 400 km less an Earth radius; apogee 406 700 km plus one.
      expect(moon.distanceKm).toBeGreaterThan(349_000)
      expect(moon.distanceKm).toBeLessThan(414_000)
      expect(moon.apparentDiameterDeg).toBeGreaterThan(0.47)
      expect(moon.apparentDiameterDeg).toBeLessThan(0.575)
    }
  })
})
