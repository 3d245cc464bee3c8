// Properties of the disk template, the views and the pin projection.

import { describe, expect, it } from 'vitest'
import {
  diskToSelenographic,
  lunarCircumstances,
  positionAngleDirection,
  selenographicToDisk,
  terminatorOutline,
  viewTransform,
} from '../../shared/lunar'
import type { DiskGeometry, DiskPoint, DiskView } from '../../shared/lunar'

const RAD = Math.PI / 180
const VIEWS: DiskView[] = (['north-up', 'zenith-up'] as const).flatMap(orientation =>
  (['none', 'inverted', 'mirrored'] as const).map(flip => ({ orientation, flip })))

// Small seeded generator so failures reproduce.
function random(seed: number) {
  let s = seed >>> 0
  return () => {
    s = (s + 0x6d2b79f5) >>> 0
    let t = Math.imul(s ^ (s >>> 15), 1 | s)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

function randomGeometry(next: () => number): DiskGeometry {
  return {
    illuminatedFraction: next(),
    brightLimbAngleDeg: 360 * next(),
    parallacticAngleDeg: 360 * next() - 180,
    axisAngleDeg: 50 * next() - 25,
    librationLonDeg: 16 * next() - 8,
    librationLatDeg: 14 * next() - 7,
  }
}

/** Great-circle distance between two selenographic points, degrees. */
function arc(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const c = Math.sin(lat1 * RAD) * Math.sin(lat2 * RAD)
    + Math.cos(lat1 * RAD) * Math.cos(lat2 * RAD) * Math.cos((lon1 - lon2) * RAD)
  return Math.acos(Math.min(1, Math.max(-1, c))) / RAD
}

function inside(p: DiskPoint, polygon: DiskPoint[]): boolean {
  let result = false
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const a = polygon[i]!
    const b = polygon[j]!
    if ((a.y > p.y) !== (b.y > p.y) && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) result = !result
  }
  return result
}

function area(polygon: DiskPoint[]): number {
  let twice = 0
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    twice += polygon[j]!.x * polygon[i]!.y - polygon[i]!.x * polygon[j]!.y
  }
  return Math.abs(twice) / 2
}

describe('pins: disk ↔ selenographic', () => {
  it('brings a selenographic point back within 0.01° through every view', () => {
    const next = random(7)
    for (const view of VIEWS) {
      for (let n = 0; n < 1500; n++) {
        const geometry = randomGeometry(next)
        const lat = Math.asin(2 * next() - 1) / RAD
        const lon = 360 * next() - 180
        const disk = selenographicToDisk(lat, lon, geometry, view)
        const b = geometry.librationLatDeg * RAD
        const facing = Math.sin(b) * Math.sin(lat * RAD)
          + Math.cos(b) * Math.cos(lat * RAD) * Math.cos((lon - geometry.librationLonDeg) * RAD)
        if (facing < 0) {
          expect(disk).toBeNull()
          continue
        }
        expect(disk).not.toBeNull()
        expect(Math.hypot(disk!.x, disk!.y)).toBeLessThanOrEqual(1 + 1e-12)
        // At the very limb the inverse is ill-conditioned; a sketch pin is never drawn there.
        if (facing < Math.sin(1 * RAD)) continue
        const back = diskToSelenographic(disk!.x, disk!.y, geometry, view)
        expect(arc(lat, lon, back!.lat, back!.lon)).toBeLessThan(0.01)
      }
    }
  })

  it('brings a disk point back to the same spot through every view', () => {
    const next = random(11)
    for (const view of VIEWS) {
      for (let n = 0; n < 1500; n++) {
        const geometry = randomGeometry(next)
        const r = 0.999 * Math.sqrt(next())
        const t = 2 * Math.PI * next()
        const point = { x: r * Math.cos(t), y: r * Math.sin(t) }
        const moon = diskToSelenographic(point.x, point.y, geometry, view)!
        const again = selenographicToDisk(moon.lat, moon.lon, geometry, view)!
        expect(Math.hypot(again.x - point.x, again.y - point.y)).toBeLessThan(1e-9)
      }
    }
  })

  it('puts the sub-observer point (the librations) at the centre and nothing beyond the limb', () => {
    const next = random(3)
    for (const view of VIEWS) {
      const geometry = randomGeometry(next)
      const centre = diskToSelenographic(0, 0, geometry, view)!
      expect(centre.lat).toBeCloseTo(geometry.librationLatDeg, 9)
      expect(centre.lon).toBeCloseTo(geometry.librationLonDeg, 9)
      expect(diskToSelenographic(0.8, 0.7, geometry, view)).toBeNull()
      const farSide = geometry.librationLonDeg > 0 ? geometry.librationLonDeg - 180 : geometry.librationLonDeg + 180
      expect(selenographicToDisk(-geometry.librationLatDeg, farSide, geometry, view)).toBeNull()
    }
  })

  it('tilts the lunar pole by the axis angle and puts lunar east toward the sky\'s west', () => {
    const geometry = { illuminatedFraction: 0.5, brightLimbAngleDeg: 270, parallacticAngleDeg: 40, axisAngleDeg: 20, librationLonDeg: 0, librationLatDeg: 0 }
    const northUp: DiskView = { orientation: 'north-up', flip: 'none' }
    const pole = selenographicToDisk(90, 0, geometry, northUp)!
    const expected = positionAngleDirection(20)
    expect(pole.x).toBeCloseTo(expected.x, 12)
    expect(pole.y).toBeCloseTo(expected.y, 12)
    // Mare Crisium (about 17° N, 59° E) lies on the Moon's western side of the sky: right with north up,
    // left in a star diagonal, lower left in an inverting telescope.
    const crisium = (view: DiskView) => selenographicToDisk(17, 59, { ...geometry, axisAngleDeg: 0 }, view)!
    expect(crisium(northUp).x).toBeGreaterThan(0.7)
    expect(crisium({ orientation: 'north-up', flip: 'mirrored' }).x).toBeLessThan(-0.7)
    const inverted = crisium({ orientation: 'north-up', flip: 'inverted' })
    expect(inverted.x).toBeLessThan(-0.7)
    expect(inverted.y).toBeLessThan(0)
  })
})

describe('views', () => {
  it('turns the zenith to the top and flips as the instrument does', () => {
    const next = random(5)
    for (let n = 0; n < 50; n++) {
      const geometry = randomGeometry(next)
      const zenith = viewTransform(geometry, { orientation: 'zenith-up', flip: 'none' })
        .toView(positionAngleDirection(geometry.parallacticAngleDeg))
      expect(zenith.x).toBeCloseTo(0, 12)
      expect(zenith.y).toBeCloseTo(1, 12)
      const p = { x: next() - 0.5, y: next() - 0.5 }
      for (const orientation of ['north-up', 'zenith-up'] as const) {
        const plain = viewTransform(geometry, { orientation, flip: 'none' }).toView(p)
        const inverted = viewTransform(geometry, { orientation, flip: 'inverted' }).toView(p)
        const mirrored = viewTransform(geometry, { orientation, flip: 'mirrored' }).toView(p)
        expect([inverted.x, inverted.y]).toEqual([-plain.x, -plain.y])
        expect([mirrored.x, mirrored.y]).toEqual([-plain.x, plain.y])
      }
      for (const view of VIEWS) {
        const t = viewTransform(geometry, view)
        const back = t.fromView(t.toView(p))
        expect(back.x).toBeCloseTo(p.x, 12)
        expect(back.y).toBeCloseTo(p.y, 12)
        expect(Math.abs(t.a * t.d - t.b * t.c)).toBeCloseTo(1, 12)
      }
    }
  })
})

describe('terminator outline', () => {
  it('draws a straight terminator through the centre at half phase', () => {
    const next = random(13)
    for (const view of VIEWS) {
      const geometry = { ...randomGeometry(next), illuminatedFraction: 0.5 }
      const { terminator, brightLimbDir } = terminatorOutline(geometry, view)
      for (const p of terminator) expect(p.x * brightLimbDir.x + p.y * brightLimbDir.y).toBeCloseTo(0, 12)
      expect(terminator.some(p => Math.hypot(p.x, p.y) < 0.02)).toBe(true)
    }
  })

  it('covers k·π of the unit disk and faces the bright limb in every view', () => {
    const next = random(17)
    for (const view of VIEWS) {
      for (let n = 0; n < 40; n++) {
        const geometry = randomGeometry(next)
        const k = geometry.illuminatedFraction
        const { litPath, brightLimbDir } = terminatorOutline(geometry, view, 256)
        expect(litPath.length).toBeGreaterThanOrEqual(128)
        expect(Math.hypot(brightLimbDir.x, brightLimbDir.y)).toBeCloseTo(1, 12)
        // The lit area is half the disk plus (or minus) half the terminator ellipse: π/2 + (π/2)(2k − 1) = πk.
        expect(area(litPath)).toBeCloseTo(Math.PI * k, 3)
        const towardLimb = { x: 0.95 * brightLimbDir.x, y: 0.95 * brightLimbDir.y }
        const awayFromLimb = { x: -0.95 * brightLimbDir.x, y: -0.95 * brightLimbDir.y }
        if (k > 0.05) expect(inside(towardLimb, litPath)).toBe(true)
        if (k < 0.95) expect(inside(awayFromLimb, litPath)).toBe(false)
      }
    }
  })

  it('follows the circle of sunrise and sunset on the Moon', () => {
    // Independent of the half-ellipse rule: every terminator point, taken back to the Moon, must lie 90° from
    // the sub-solar point given by the colongitude (l0 = 90° − c0) and the Sun's selenographic latitude.
    const cases: Array<[string, number, number]> = [
      ['2026-03-20T02:15:00Z', 33.45, -112.07],
      ['2026-03-25T20:00:00Z', 51.5, -0.1],
      ['2026-03-29T11:00:00Z', -33.9, 151.2],
      ['2026-04-07T04:00:00Z', 64.1, -21.9],
    ]
    for (const [iso, latitude, longitude] of cases) {
      const moon = lunarCircumstances(new Date(iso), { latitude, longitude })
      const sunLat = moon.subSolarLatDeg
      const sunLon = 90 - moon.colongitudeDeg
      for (const view of VIEWS) {
        const { terminator, litPath } = terminatorOutline(moon, view, 200)
        for (const p of terminator.slice(20, -20)) {
          const q = diskToSelenographic(p.x, p.y, moon, view)!
          expect(Math.abs(arc(q.lat, q.lon, sunLat, sunLon) - 90)).toBeLessThan(0.3)
        }
        const subSolar = selenographicToDisk(sunLat, ((sunLon + 540) % 360) - 180, moon, view)
        if (moon.illuminatedFraction > 0.55) expect(inside(subSolar!, litPath)).toBe(true)
        if (moon.illuminatedFraction < 0.45) expect(subSolar).toBeNull()
      }
    }
  })
})
