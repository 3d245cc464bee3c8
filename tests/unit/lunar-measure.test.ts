// Hand measurements: clinometer readings and compass bearings.

import { readFileSync } from 'node:fs'
import { magvar } from 'magvar'
import { describe, expect, it } from 'vitest'
import {
  LUNAR_MODEL_VERSION,
  MAGNETIC_MODEL,
  clinometerToAltitude,
  magneticDeclination,
  magneticModelCovers,
  magneticToTrueAzimuth,
} from '../../shared/lunar'

describe('clinometer', () => {
  it('reads altitude as |reading − 90°| (common practice)', () => {
    // A protractor clinometer reads 90° with the straw level and 0° pointing at the zenith.
    expect(clinometerToAltitude(40)).toBe(50)
    expect(clinometerToAltitude(30)).toBe(60)
    expect(clinometerToAltitude(109)).toBe(19)
    expect(clinometerToAltitude(90)).toBe(0)
    expect(clinometerToAltitude(0)).toBe(90)
  })
})

describe('magnetic declination (World Magnetic Model 2025)', () => {
  // NOAA/NCEI "WMM2025 Test Values" (WMM2025_TEST_VALUES.txt, the report's 12-point table), declination D in
  // degrees. Recalled from memory and confirmed against copies of the table quoted in other open-source
  // projects' tests; magvar 2.2.0 carries the WMM2025 coefficients (epoch 2025.0, valid to 2030.0). The
  // table prints D to 0.01° and magvar rounds to 0.01°, so the two should agree to that figure.
  // Longitude 240° E is written −120°, the module's range. Decimal year 2027.5 is 2027-07-02 12:00 UTC.
  const rows: Array<[number, number, number, number, number]> = [
    // year, height km, latitude, longitude, D
    [2025.0, 0, 80, 0, 1.28],
    [2025.0, 0, 0, 120, -0.16],
    [2025.0, 0, -80, -120, 68.78],
    [2025.0, 100, 80, 0, 0.85],
    [2025.0, 100, 0, 120, -0.15],
    [2025.0, 100, -80, -120, 68.21],
    [2027.5, 0, 80, 0, 2.59],
    [2027.5, 0, 0, 120, -0.24],
    [2027.5, 0, -80, -120, 68.49],
    [2027.5, 100, 80, 0, 2.16],
    [2027.5, 100, 0, 120, -0.23],
    [2027.5, 100, -80, -120, 67.93],
  ]
  const instant = (year: number) => (year === 2025.0 ? new Date('2025-01-01T00:00:00Z') : new Date('2027-07-02T12:00:00Z'))

  for (const [year, heightKm, latitude, longitude, declination] of rows) {
    // Sites stop at 10 km, so the 100 km rows check the magvar package the module calls, directly.
    it(`gives D = ${declination}° at ${latitude}°, ${longitude}°, ${heightKm} km, ${year}`, () => {
      const computed = heightKm === 0
        ? magneticDeclination({ latitude, longitude }, instant(year))
        : magvar(latitude, longitude, heightKm, instant(year))
      expect(Math.abs(computed - declination)).toBeLessThanOrEqual(0.01 + 1e-9)
    })
  }

  it('adds the declination to a compass bearing, wrapping past north', () => {
    const site = { latitude: -80, longitude: -120 }
    // D = +68.78° there at 2025.0 (table above): magnetic north lies 68.78° east of true north.
    expect(magneticToTrueAzimuth(350, site, new Date('2025-01-01T00:00:00Z'))).toBeCloseTo(58.78, 6)
    expect(magneticToTrueAzimuth(0, { latitude: 0, longitude: 120 }, new Date('2025-01-01T00:00:00Z'))).toBeCloseTo(359.84, 6)
  })

  it('knows the model\'s period of validity', () => {
    expect(MAGNETIC_MODEL.name).toBe('WMM2025')
    expect(magneticModelCovers(new Date('2026-03-14T20:30:00Z'))).toBe(true)
    expect(magneticModelCovers(new Date('2030-01-01T00:00:00Z'))).toBe(false)
    expect(magneticModelCovers(new Date('2024-12-31T23:59:59Z'))).toBe(false)
  })
})

describe('model version', () => {
  it('names the astronomy-engine release it was computed with', () => {
    // Stored with each observation: a silent library upgrade must show up here first.
    const installed = JSON.parse(readFileSync('node_modules/astronomy-engine/package.json', 'utf8')).version
    expect(LUNAR_MODEL_VERSION).toContain(`astronomy-engine ${installed}`)
  })
})
