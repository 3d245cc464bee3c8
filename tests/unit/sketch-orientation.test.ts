// The disk template turned as the observer sees it: the lit side lies where the bright limb's position angle
// says, turned by the parallactic angle for the sky view and by the instrument's flip; drawings follow a
// change of view.

import { describe, expect, it } from 'vitest'
import { lunarCircumstances } from '../../shared/lunar'
import type { DiskGeometry, DiskView } from '../../shared/lunar'
import { DISK_CENTRE, DISK_RADIUS, defaultSketchView, flipForInstrument, reframer } from '../../shared/sketch/frame'
import { selenographicGrid, sketchTemplate } from '../../shared/sketch/template'

const C = DISK_CENTRE
const RAD = Math.PI / 180

/** Area centroid of a closed polygon given as flat x, y. */
function centroid(flat: readonly number[]) {
  let a = 0
  let cx = 0
  let cy = 0
  const n = flat.length / 2
  for (let i = 0; i < n; i++) {
    const [x0, y0] = [flat[2 * i]!, flat[2 * i + 1]!]
    const [x1, y1] = [flat[2 * ((i + 1) % n)]!, flat[2 * ((i + 1) % n) + 1]!]
    const cross = x0 * y1 - x1 * y0
    a += cross
    cx += (x0 + x1) * cross
    cy += (y0 + y1) * cross
  }
  return { x: cx / (3 * a), y: cy / (3 * a) }
}

/** Direction of the lit region's centroid from the disk's centre, canvas angles (0 = right, 90 = down). */
function litDirectionDeg(geometry: DiskGeometry, view: DiskView): number {
  const c = centroid(sketchTemplate(geometry, view).lit)
  return (Math.atan2(c.y - C, c.x - C) / RAD + 360) % 360
}

const angleGap = (a: number, b: number) => Math.abs(((a - b + 540) % 360) - 180)

const crescent = (brightLimbAngleDeg: number, parallacticAngleDeg = 0): DiskGeometry => ({
  illuminatedFraction: 0.2,
  brightLimbAngleDeg,
  parallacticAngleDeg,
  axisAngleDeg: 0,
  librationLonDeg: 0,
  librationLatDeg: 0,
})

describe('north up, no flip: the sky as charted', () => {
  // Common practice (star charts, the IAU convention for position angles): north up, east to the LEFT,
  // position angles counted from north through east. On the canvas y grows downward.
  it.each([
    [0, 270, 'up'],
    [90, 180, 'left (east)'],
    [180, 90, 'down'],
    [270, 0, 'right (west)'],
  ])('a bright limb at position angle %i° lights the %s side', (chi, canvasDeg) => {
    expect(angleGap(litDirectionDeg(crescent(chi), { orientation: 'north-up', flip: 'none' }), canvasDeg)).toBeLessThan(0.5)
  })

  it('gives the bright limb as a unit vector on the canvas, toward the lit side', () => {
    const t = sketchTemplate(crescent(270), { orientation: 'north-up', flip: 'none' })
    expect(t.brightLimb.x).toBeCloseTo(1, 9)
    expect(t.brightLimb.y).toBeCloseTo(0, 9)
  })

  it('marks north above the disk and east to its left', () => {
    const t = sketchTemplate(crescent(0), { orientation: 'north-up', flip: 'none' })
    expect(t.marks.north.y).toBeLessThan(C - DISK_RADIUS)
    expect(t.marks.east.x).toBeLessThan(C - DISK_RADIUS)
  })
})

describe('zenith up turns the disk by the parallactic angle', () => {
  it('puts the bright limb straight up when the Sun stands directly above the Moon (χ = q)', () => {
    for (const q of [-120, -35, 0, 40, 150]) {
      expect(angleGap(litDirectionDeg(crescent(q, q), { orientation: 'zenith-up', flip: 'none' }), 270)).toBeLessThan(0.5)
    }
  })

  it('turns the lit side clockwise on the canvas by q for the same χ', () => {
    // A position angle θ points along (−sin(θ − q), cos(θ − q)) in the zenith-up view (shared/lunar/disk.ts):
    // seen with y down, a larger q moves the lit side clockwise from its north-up place.
    for (const q of [-60, 25, 80]) {
      const northUp = litDirectionDeg(crescent(200, q), { orientation: 'north-up', flip: 'none' })
      const zenithUp = litDirectionDeg(crescent(200, q), { orientation: 'zenith-up', flip: 'none' })
      expect(angleGap(zenithUp, northUp + q)).toBeLessThan(0.5)
    }
  })
})

describe('the instrument flip', () => {
  it('maps the instrument views to flips', () => {
    expect(flipForInstrument('upright')).toBe('none')
    expect(flipForInstrument('inverted')).toBe('inverted')
    expect(flipForInstrument('mirrored')).toBe('mirrored')
    expect(defaultSketchView('mirrored')).toEqual({ orientation: 'zenith-up', flip: 'mirrored' })
  })

  it('mirrored (a star diagonal) swaps left and right; inverted turns the image half round', () => {
    for (const orientation of ['north-up', 'zenith-up'] as const) {
      const geometry = crescent(63, 31)
      const plain = litDirectionDeg(geometry, { orientation, flip: 'none' })
      expect(angleGap(litDirectionDeg(geometry, { orientation, flip: 'mirrored' }), 180 - plain)).toBeLessThan(0.5)
      expect(angleGap(litDirectionDeg(geometry, { orientation, flip: 'inverted' }), plain + 180)).toBeLessThan(0.5)
    }
  })
})

describe('real evenings', () => {
  // New moon of 2026-02-17 (the day of that year's annular solar eclipse; from memory). Three days later the
  // evening crescent stands in the west after sunset, lit on the side toward the set Sun: lower right from
  // mid-northern latitudes, lower left from the southern hemisphere (common practice: the waxing Moon is lit
  // on the right in the north, on the left in the south).
  const at = new Date('2026-02-20T18:30:00Z')

  it('lights a northern evening crescent on the lower right in the sky view', () => {
    const c = lunarCircumstances(at, { latitude: 52.634, longitude: -1.692, elevation: 95 })
    expect(c.waxing).toBe(true)
    expect(c.illuminatedFraction).toBeLessThan(0.25)
    expect(c.altitudeDeg).toBeGreaterThan(0)
    const direction = litDirectionDeg(c, { orientation: 'zenith-up', flip: 'none' })
    expect(direction).toBeGreaterThan(0)
    expect(direction).toBeLessThan(90)
  })

  it('lights a southern evening crescent on the left in the sky view, and the other way in a diagonal', () => {
    const c = lunarCircumstances(new Date('2026-02-20T18:10:00Z'), { latitude: -34.21, longitude: 18.47, elevation: 40 })
    expect(c.altitudeDeg).toBeGreaterThan(0)
    const direction = litDirectionDeg(c, { orientation: 'zenith-up', flip: 'none' })
    expect(angleGap(direction, 180)).toBeLessThan(90)
    expect(angleGap(litDirectionDeg(c, { orientation: 'zenith-up', flip: 'mirrored' }), 0)).toBeLessThan(90)
  })

  it('keeps the lit side the same whether it is found from the polygon or the bright-limb vector', () => {
    const c = lunarCircumstances(at, { latitude: 52.634, longitude: -1.692 })
    for (const view of [{ orientation: 'north-up', flip: 'none' }, { orientation: 'zenith-up', flip: 'mirrored' }] as DiskView[]) {
      const t = sketchTemplate(c, view)
      const vector = (Math.atan2(t.brightLimb.y, t.brightLimb.x) / RAD + 360) % 360
      expect(angleGap(vector, litDirectionDeg(c, view))).toBeLessThan(0.5)
    }
  })
})

describe('the terminator and the grid', () => {
  it('draws the half Moon terminator as the diameter across the bright limb', () => {
    const t = sketchTemplate({ ...crescent(120, 20), illuminatedFraction: 0.5 }, { orientation: 'zenith-up', flip: 'none' })
    for (let i = 0; i < t.terminator.length; i += 2) {
      const along = (t.terminator[i]! - C) * t.brightLimb.x + (t.terminator[i + 1]! - C) * t.brightLimb.y
      expect(Math.abs(along)).toBeLessThan(1e-6)
    }
  })

  it('keeps the grid on the disk, with the equator level when there is no libration', () => {
    const geometry = crescent(270)
    const lines = selenographicGrid(geometry, { orientation: 'north-up', flip: 'none' })
    for (const line of lines) {
      for (let i = 0; i < line.length; i += 2) {
        expect(Math.hypot(line[i]! - C, line[i + 1]! - C)).toBeLessThanOrEqual(DISK_RADIUS + 1e-6)
      }
    }
    // With no libration the equator (a parallel with every y at the centre) is one of the lines.
    expect(lines.some(line => line.every((v, i) => i % 2 === 0 || Math.abs(v - C) < 1e-6))).toBe(true)
    // Seven parallels north of the equator and as many south, plus the near-side meridians every 15°.
    expect(lines.length).toBeGreaterThanOrEqual(11 + 12)
  })
})

describe('a drawing follows a change of view', () => {
  it('carries a mark over the bright limb to the bright limb of the new view', () => {
    const c = lunarCircumstances(new Date('2026-02-20T18:30:00Z'), { latitude: 52.634, longitude: -1.692 })
    const views: DiskView[] = [
      { orientation: 'zenith-up', flip: 'none' },
      { orientation: 'north-up', flip: 'none' },
      { orientation: 'north-up', flip: 'mirrored' },
      { orientation: 'zenith-up', flip: 'inverted' },
    ]
    for (const from of views) {
      for (const to of views) {
        const a = sketchTemplate(c, from).brightLimb
        const b = sketchTemplate(c, to).brightLimb
        const moved = reframer(c, from, to)(C + 700 * a.x, C + 700 * a.y)
        expect(moved.x).toBeCloseTo(C + 700 * b.x, 6)
        expect(moved.y).toBeCloseTo(C + 700 * b.y, 6)
      }
    }
  })
})
