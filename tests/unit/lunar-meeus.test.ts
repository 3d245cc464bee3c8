// The lunar module against the worked examples of Meeus, Astronomical Algorithms, 2nd ed. (1998).
// Meeus's instants are in dynamical time (TD ≈ TT). The module takes UTC, so each TD instant is turned into
// UTC with astronomy-engine's own ΔT model (58.5 s for 1992 April against Meeus's 59 s; 47.7 s for 1977
// against his 48 s) — a difference of a fraction of a second, far inside every tolerance below.
// The book's figures are quoted from memory of the examples; the ones that could be re-derived by hand
// (parallactic angle) are marked as such.

import {
  AstroTime,
  Body,
  Equator,
  Horizon,
  Illumination,
  Libration,
  MakeTime,
  Observer,
  RotateVector,
  Rotation_HOR_EQD,
  Spherical,
  VectorFromHorizon,
} from 'astronomy-engine'
import { describe, expect, it } from 'vitest'
import {
  geocentricCircumstances,
  lunarCircumstances,
  parallacticAngle,
  phaseEvents,
} from '../../shared/lunar'
import { bodyRiseSetTransit } from '../../shared/lunar/riseset'

const J2000_JD = 2451545.0
const fromTd = (jde: number): Date => AstroTime.FromTerrestrialTime(jde - J2000_JD).date

// 1992 April 12, 0h TD = JDE 2448724.5, the instant of Meeus's examples 47.a, 48.a and 53.a.
const APRIL_1992 = fromTd(2448724.5)

describe('illuminated fraction and bright limb (Meeus example 48.a)', () => {
  const disk = geocentricCircumstances(APRIL_1992)

  it('gives the phase angle and illuminated fraction', () => {
    // Meeus 48.a: i = 69.0756°, k = 0.6786. The library's lunar and solar positions differ from the book's
    // truncated series by a few arcseconds, so 0.01° and 0.0005 are generous.
    expect(disk.phaseAngleDeg).toBeCloseTo(69.0756, 2)
    expect(Math.abs(disk.illuminatedFraction - 0.6786)).toBeLessThan(0.0005)
  })

  it('gives the position angle of the bright limb', () => {
    // Meeus 48.a: χ = 285.0°, printed to 0.1°.
    expect(Math.abs(disk.brightLimbAngleDeg - 285.0)).toBeLessThan(0.1)
  })
})

describe('librations, axis and the Sun on the Moon (Meeus example 53.a)', () => {
  const disk = geocentricCircumstances(APRIL_1992)

  // The module orients the Moon with the IAU rotation model that astronomy-engine carries; Meeus uses
  // Eckhardt's physical-libration series. The two agree to a few hundredths of a degree (0.027° in latitude
  // here), so the tolerance on the librations is 0.04°; P and the sub-solar point agree to 0.01°.
  it('gives the total libration in longitude and latitude', () => {
    // Meeus 53.a: optical l′ = −1.206°, b′ = +4.194°; with physical libration l = −1.23°, b = +4.20°.
    expect(Math.abs(disk.librationLonDeg - -1.23)).toBeLessThan(0.04)
    expect(Math.abs(disk.librationLatDeg - 4.20)).toBeLessThan(0.04)
  })

  it('gives the position angle of the axis', () => {
    // Meeus 53.a: P = 15.08°.
    expect(Math.abs(disk.axisAngleDeg - 15.08)).toBeLessThan(0.02)
  })

  it('gives the Sun\'s selenographic position and colongitude', () => {
    // Meeus 53.a: l0 = 67.89°, b0 = +1.46°, c0 = 22.11°.
    expect(Math.abs(disk.subSolarLatDeg - 1.46)).toBeLessThan(0.02)
    expect(Math.abs(disk.colongitudeDeg - 22.11)).toBeLessThan(0.02)
  })

  it('agrees with astronomy-engine\'s own Meeus-based Libration() and Illumination() through a year', () => {
    // A second, independent implementation inside the library (Meeus ch. 53 series, geocentric).
    for (let i = 0; i < 120; i++) {
      const at = new Date(Date.UTC(2026, 0, 1) + i * 3.04 * 86_400_000)
      const ours = geocentricCircumstances(at)
      const library = Libration(at)
      expect(Math.abs(ours.librationLatDeg - library.elat)).toBeLessThan(0.04)
      expect(Math.abs(ours.librationLonDeg - library.elon)).toBeLessThan(0.01)
      expect(Math.abs(ours.distanceKm - library.dist_km)).toBeLessThan(1)
      expect(Math.abs(ours.phaseAngleDeg - Illumination(Body.Moon, at).phase_angle)).toBeLessThan(0.01)
    }
  })
})

describe('instant of new moon (Meeus example 49.a)', () => {
  it('finds the new moon of 1977 February at 3h37m42s TD', () => {
    // Meeus 49.a: JDE 2443192.65118 = 1977 February 18, 3h37m42s TD (his mean-phase series; he gives
    // 3h37m40s from ELP-2000/82 as the exact value). Compared in TT, so ΔT plays no part. Without the
    // aberration correction the library's search lands 39 s late and this fails.
    const [event] = phaseEvents(new Date('1977-02-17T00:00:00Z'), new Date('1977-02-19T00:00:00Z'))
    expect(event?.kind).toBe('new')
    const jde = MakeTime(event!.at).tt + J2000_JD
    expect(Math.abs(jde - 2443192.65118) * 86_400).toBeLessThan(10)
  })
})

describe('rising, transit and setting (Meeus example 15.a: Venus at Boston, 1988 March 20)', () => {
  // Meeus 15.a: Boston at 42°20′ N, 71°05′ W (west-positive in the book, so longitude −71.0833° here).
  // Results in UT on the UT day 1988 March 20: rising 12h25m, transit 19h41m, setting 2h55m, printed to the
  // minute; astronomy-engine's search with the same standard altitude (−0°34′ for a point source) should land
  // within a minute of each.
  const boston = { latitude: 42 + 20 / 60, longitude: -(71 + 5 / 60) }
  const minute = 60_000

  it('matches the book on the UT day', () => {
    const events = bodyRiseSetTransit(Body.Venus, '1988-03-20', boston, 'UTC')
    expect(Math.abs(events.rise!.getTime() - Date.UTC(1988, 2, 20, 12, 25))).toBeLessThan(minute)
    expect(Math.abs(events.transit!.getTime() - Date.UTC(1988, 2, 20, 19, 41))).toBeLessThan(minute)
    expect(Math.abs(events.set!.getTime() - Date.UTC(1988, 2, 20, 2, 55))).toBeLessThan(minute)
  })

  it('keeps the Boston calendar day in America/New_York (EST, UTC−5, in March 1988)', () => {
    // The 2h55m UT setting belongs to the previous Boston evening; the local day's setting is the next one,
    // a day later and (Venus drifting slowly) within a few minutes of the same sidereal geometry.
    const events = bodyRiseSetTransit(Body.Venus, '1988-03-20', boston, 'America/New_York')
    expect(Math.abs(events.rise!.getTime() - Date.UTC(1988, 2, 20, 12, 25))).toBeLessThan(minute)
    expect(Math.abs(events.transit!.getTime() - Date.UTC(1988, 2, 20, 19, 41))).toBeLessThan(minute)
    const nextEvening = Date.UTC(1988, 2, 21, 2, 55)
    expect(Math.abs(events.set!.getTime() - nextEvening)).toBeLessThan(15 * minute)
  })
})

describe('parallactic angle (Meeus eq. 14.1)', () => {
  it('matches cases worked by hand', () => {
    // On the meridian south of the zenith the zenith is due north of the object: q = 0.
    expect(parallacticAngle(0, 20, 50)).toBeCloseTo(0, 10)
    // Culminating north of the zenith (δ > φ): q = 180°.
    expect(Math.abs(parallacticAngle(0, 70, 40))).toBeCloseTo(180, 10)
    // On the celestial equator six hours from the meridian: q = ±(90° − φ).
    expect(parallacticAngle(90, 0, 40)).toBeCloseTo(50, 10)
    expect(parallacticAngle(-90, 0, 40)).toBeCloseTo(-50, 10)
    // H = 30°, δ = 10°, φ = 45°, by hand: tan q = 0.5 / (1 × 0.98481 − 0.17365 × 0.86603) = 0.59921, q = 30.93°.
    expect(parallacticAngle(30, 10, 45)).toBeCloseTo(30.93, 2)
    // At the pole the zenith is the celestial pole, so it lies due north of everything.
    expect(parallacticAngle(123, 35, 90)).toBeCloseTo(0, 6)
  })

  it('points at the zenith found with the library\'s horizontal frame', () => {
    // Independent route: step 0.05° up in altitude from the Moon using astronomy-engine's horizon rotation,
    // and measure the position angle of that step on the sky.
    const site = { latitude: 51.5, longitude: -0.1 }
    const observer = new Observer(site.latitude, site.longitude, 0)
    for (const iso of ['2026-03-24T19:00:00Z', '2026-03-27T23:30:00Z', '2026-04-01T03:00:00Z']) {
      const at = new Date(iso)
      const moon = Equator(Body.Moon, at, observer, true, true)
      const hor = Horizon(at, observer, moon.ra, moon.dec)
      const up = VectorFromHorizon(new Spherical(hor.altitude + 0.05, hor.azimuth, 1), at, '')
      const step = RotateVector(Rotation_HOR_EQD(at, observer), up)
      const ra = Math.atan2(step.y, step.x)
      const dec = Math.atan2(step.z, Math.hypot(step.x, step.y))
      const ra0 = moon.ra * 15 * Math.PI / 180
      const dec0 = moon.dec * Math.PI / 180
      const pa = Math.atan2(
        Math.cos(dec) * Math.sin(ra - ra0),
        Math.sin(dec) * Math.cos(dec0) - Math.cos(dec) * Math.sin(dec0) * Math.cos(ra - ra0),
      ) * 180 / Math.PI
      const q = lunarCircumstances(at, site).parallacticAngleDeg
      expect(Math.abs(((pa - q + 540) % 360) - 180)).toBeLessThan(0.05)
    }
  })
})
