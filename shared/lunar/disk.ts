// The apparent disk: views, the lit region and terminator, and pins ↔ selenographic coordinates.
//
// Coordinates. Every function here works on the unit disk (radius 1 = the Moon's apparent radius) with x to
// the right and y UP, as the observer sees the view; a canvas, whose y grows downward, must negate y.
//
//   • Position-angle frame = the 'north-up', flip 'none' view: celestial north is +y and celestial EAST is to
//     the LEFT (−x), as on the sky. A position angle θ (from north through east) points along
//     (x, y) = (−sin θ, cos θ).
//   • 'zenith-up': the position-angle frame turned so the zenith, whose position angle at the Moon is the
//     parallactic angle q, points to +y: a position angle θ then points along (−sin(θ − q), cos(θ − q)).
//   • Flip, applied after orientation: 'inverted' turns the view 180° (a refractor or Newtonian without a
//     diagonal); 'mirrored' swaps left and right (a star diagonal).

import { DEG, wrap180 } from './geometry'
import { requireFinite, requireNumber, requireView } from './validate'
import type {
  DiskGeometry,
  DiskPoint,
  DiskView,
  SelenographicPoint,
  TerminatorOutline,
  ViewTransform,
} from './types'

function requireGeometry(value: unknown): DiskGeometry {
  if (typeof value !== 'object' || value === null) {
    throw new RangeError('circumstances must be an object from lunarCircumstances')
  }
  const c = value as Record<string, unknown>
  return {
    illuminatedFraction: requireNumber(c.illuminatedFraction, 'circumstances.illuminatedFraction', 0, 1),
    brightLimbAngleDeg: requireNumber(c.brightLimbAngleDeg, 'circumstances.brightLimbAngleDeg', -360, 360),
    parallacticAngleDeg: requireNumber(c.parallacticAngleDeg, 'circumstances.parallacticAngleDeg', -360, 360),
    axisAngleDeg: requireNumber(c.axisAngleDeg, 'circumstances.axisAngleDeg', -360, 360),
    librationLonDeg: requireNumber(c.librationLonDeg, 'circumstances.librationLonDeg', -180, 180),
    librationLatDeg: requireNumber(c.librationLatDeg, 'circumstances.librationLatDeg', -90, 90),
  }
}

/** Direction of a position angle in the position-angle frame. */
export function positionAngleDirection(deg: number): DiskPoint {
  return { x: -Math.sin(deg * DEG), y: Math.cos(deg * DEG) }
}

/** The view as a linear map from the position-angle frame; its inverse takes view points back. */
export function viewTransform(circumstances: DiskGeometry, view: DiskView): ViewTransform {
  const geometry = requireGeometry(circumstances)
  const { orientation, flip } = requireView(view)
  // Turning by −q (counter-clockwise positive) brings the zenith's direction (−sin q, cos q) to (0, 1).
  const turn = orientation === 'zenith-up' ? -geometry.parallacticAngleDeg * DEG : 0
  const cos = Math.cos(turn)
  const sin = Math.sin(turn)
  const fx = flip === 'none' ? 1 : -1
  const fy = flip === 'inverted' ? -1 : 1
  const a = fx * cos
  const b = -fx * sin
  const c = fy * sin
  const d = fy * cos
  const det = a * d - b * c
  return {
    a,
    b,
    c,
    d,
    toView: p => ({ x: a * p.x + b * p.y, y: c * p.x + d * p.y }),
    fromView: p => ({ x: (d * p.x - b * p.y) / det, y: (a * p.y - c * p.x) / det }),
  }
}

/**
 * The lit part of the disk. The terminator is the half-ellipse whose semi-minor axis |1 − 2k| lies along the
 * bright limb's position angle χ (the product's design note; it is the orthographic image of the great circle
 * facing the Sun, since |1 − 2k| = |cos i|). Along χ the terminator crosses at 1 − 2k: toward the bright limb
 * for a crescent, away from it for a gibbous Moon. `segments` steps make each half of the outline.
 */
export function terminatorOutline(circumstances: DiskGeometry, view: DiskView, segments = 96): TerminatorOutline {
  const geometry = requireGeometry(circumstances)
  const steps = Math.round(requireNumber(segments, 'segments', 8, 4096))
  const transform = viewTransform(geometry, view)
  const u = positionAngleDirection(geometry.brightLimbAngleDeg)
  const v = positionAngleDirection(geometry.brightLimbAngleDeg + 90)
  const bulge = 1 - 2 * geometry.illuminatedFraction
  const at = (along: number, across: number) =>
    transform.toView({ x: along * u.x + across * v.x, y: along * u.y + across * v.y })

  const limb: DiskPoint[] = []
  const terminator: DiskPoint[] = []
  for (let i = 0; i <= steps; i++) {
    const s = -Math.PI / 2 + (Math.PI * i) / steps
    limb.push(at(Math.cos(s), Math.sin(s)))
    terminator.push(at(bulge * Math.cos(s), Math.sin(s)))
  }
  // Limb from one cusp to the other, then the terminator back, without repeating the cusps.
  const litPath = [...limb, ...terminator.slice(1, -1).reverse()]
  return { litPath, terminator, brightLimbDir: transform.toView(u) }
}

/**
 * Orthographic projection centred on the sub-observer point (b, l) and turned by the axis angle P: the
 * oblique orthographic formulas, forward and inverse, of Snyder, Map Projections — A Working Manual (USGS
 * Professional Paper 1395), ch. 20; librations and P as defined in Meeus, Astronomical Algorithms 2nd ed.,
 * ch. 53.
 * Lunar east (+longitude, toward Mare Crisium) lies toward celestial west, so with P = 0 it is +x.
 */
export function selenographicToDisk(
  lat: number,
  lon: number,
  circumstances: DiskGeometry,
  view: DiskView,
): DiskPoint | null {
  const phi = requireNumber(lat, 'lat', -90, 90) * DEG
  const lambda = requireNumber(lon, 'lon', -180, 180) * DEG
  const geometry = requireGeometry(circumstances)
  const transform = viewTransform(geometry, view)
  const b = geometry.librationLatDeg * DEG
  const dl = lambda - geometry.librationLonDeg * DEG
  const facing = Math.sin(b) * Math.sin(phi) + Math.cos(b) * Math.cos(phi) * Math.cos(dl)
  if (facing < 0) return null
  const east = Math.cos(phi) * Math.sin(dl)
  const north = Math.cos(b) * Math.sin(phi) - Math.sin(b) * Math.cos(phi) * Math.cos(dl)
  const p = geometry.axisAngleDeg * DEG
  return transform.toView({
    x: east * Math.cos(p) - north * Math.sin(p),
    y: east * Math.sin(p) + north * Math.cos(p),
  })
}

export function diskToSelenographic(
  x: number,
  y: number,
  circumstances: DiskGeometry,
  view: DiskView,
): SelenographicPoint | null {
  requireFinite(x, 'x')
  requireFinite(y, 'y')
  const geometry = requireGeometry(circumstances)
  const frame = viewTransform(geometry, view).fromView({ x, y })
  const p = geometry.axisAngleDeg * DEG
  const east = frame.x * Math.cos(p) + frame.y * Math.sin(p)
  const north = -frame.x * Math.sin(p) + frame.y * Math.cos(p)
  const rho2 = east * east + north * north
  if (rho2 > 1) return null
  const depth = Math.sqrt(1 - rho2)
  const b = geometry.librationLatDeg * DEG
  const lat = Math.asin(Math.max(-1, Math.min(1, depth * Math.sin(b) + north * Math.cos(b)))) / DEG
  const lon = geometry.librationLonDeg + Math.atan2(east, depth * Math.cos(b) - north * Math.sin(b)) / DEG
  return { lat, lon: wrap180(lon) }
}
