// The Moon's body-fixed frame, and the selenographic point that faces a given direction.

import { Body, RotateVector, RotationAxis, Vector } from 'astronomy-engine'
import type { AstroTime, RotationMatrix } from 'astronomy-engine'
import { DEG, cross, dot, unit, wrap180 } from './geometry'
import type { Vec3 } from './geometry'
import type { SelenographicPoint } from './types'

/** Unit vectors of the Moon's frame, expressed in the true equator and equinox of date. */
export interface MoonFrame {
  /** Toward the Moon's north rotation pole. */
  pole: Vec3
  /** Toward selenographic latitude 0, longitude 0. */
  meridian: Vec3
  /** Toward latitude 0, longitude 90° east. */
  east: Vec3
}

/**
 * astronomy-engine's RotationAxis gives the Moon's pole and prime-meridian angle W from the IAU WGCCRE
 * rotation model (Archinal et al. 2011, Celest. Mech. Dyn. Astr. 109, table 2, with its periodic libration
 * terms). That report measures W along the body's equator from the ascending node of that equator on the
 * J2000 equator, i.e. from the direction ẑ × pole.
 */
export function moonFrame(time: AstroTime, j2000ToDate: RotationMatrix): MoonFrame {
  const axis = RotationAxis(Body.Moon, time)
  const pole = axis.north
  const node = unit(cross({ x: 0, y: 0, z: 1 }, pole))
  const nodeEast = cross(pole, node)
  const w = axis.spin * DEG
  const meridian = new Vector(
    Math.cos(w) * node.x + Math.sin(w) * nodeEast.x,
    Math.cos(w) * node.y + Math.sin(w) * nodeEast.y,
    Math.cos(w) * node.z + Math.sin(w) * nodeEast.z,
    time,
  )
  const poleOfDate = RotateVector(j2000ToDate, pole)
  const meridianOfDate = RotateVector(j2000ToDate, meridian)
  return { pole: poleOfDate, meridian: meridianOfDate, east: cross(poleOfDate, meridianOfDate) }
}

/**
 * The selenographic point under a direction from the Moon's centre: toward the observer it is the
 * libration in longitude and latitude, toward the Sun the sub-solar point (Meeus, Astronomical Algorithms
 * 2nd ed., ch. 53 defines both the same way; here as planetocentric coordinates in the IAU frame).
 */
export function selenographicPointToward(direction: Vec3, frame: MoonFrame): SelenographicPoint {
  const d = unit(direction)
  return {
    lat: Math.asin(Math.max(-1, Math.min(1, dot(d, frame.pole)))) / DEG,
    lon: wrap180(Math.atan2(dot(d, frame.east), dot(d, frame.meridian)) / DEG),
  }
}
