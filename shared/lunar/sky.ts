// The sky around the Moon for an observer: parallactic angle, Sun cautions, twilight, fixed stars.

import { Horizon, MakeTime, Observer, RotateVector, Rotation_EQJ_EQD, Vector } from 'astronomy-engine'
import { DEG, angleBetweenDeg, raDecOf } from './geometry'
import { sceneAt } from './scene'
import { requireDate, requireNumber, requireSite } from './validate'
import type { FixedStar, HorizontalPosition, Site, SkyDarkness, SunCaution, Twilight } from './types'

/**
 * Parallactic angle q: the position angle of the zenith at an object. Meeus, Astronomical Algorithms 2nd ed.,
 * ch. 14, eq. 14.1: tan q = sin H / (tan φ cos δ − sin δ cos H), with H the local hour angle (positive
 * west), δ the declination and φ the latitude. Negative before the meridian, positive after; ±180° for an
 * object culminating north of the zenith.
 */
export function parallacticAngle(hourAngleDeg: number, declinationDeg: number, latitudeDeg: number): number {
  const h = hourAngleDeg * DEG
  const d = declinationDeg * DEG
  const phi = latitudeDeg * DEG
  return Math.atan2(Math.sin(h), Math.tan(phi) * Math.cos(d) - Math.sin(d) * Math.cos(h)) / DEG
}

/** The warning threshold from the product's cautions: never aim an instrument within 15° of the Sun. */
export const SUN_CAUTION_SEPARATION_DEG = 15

// Geometric altitudes of the Sun's centre that bound day and the three twilights (common practice, as in
// the almanacs): −0.833° is the upper limb on the horizon with standard refraction, as in sunrise and sunset.
const SUNSET_ALTITUDE_DEG = -0.833
const CIVIL_DEG = -6
const NAUTICAL_DEG = -12
const ASTRONOMICAL_DEG = -18

function sunGeometricAltitude(at: Date, site: Required<Site>) {
  const scene = sceneAt(at, site)
  const sun = raDecOf(scene.sunTopo)
  const altitudeDeg = Horizon(scene.time, scene.observer, sun.raDeg / 15, sun.decDeg).altitude
  return { scene, altitudeDeg }
}

/** Whether the Sun is up or the Moon is close to it: show the caution before anyone aims an instrument. */
export function sunCaution(at: Date, site: Site): SunCaution {
  const { scene, altitudeDeg } = sunGeometricAltitude(requireDate(at, 'at'), requireSite(site))
  const moonSunSeparationDeg = angleBetweenDeg(scene.moonTopo, scene.sunTopo)
  const sunUp = altitudeDeg > SUNSET_ALTITUDE_DEG
  return {
    sunUp,
    sunAltitudeDeg: altitudeDeg,
    moonSunSeparationDeg,
    warn: sunUp || moonSunSeparationDeg < SUN_CAUTION_SEPARATION_DEG,
  }
}

export function twilight(at: Date, site: Site): Twilight {
  const { altitudeDeg } = sunGeometricAltitude(requireDate(at, 'at'), requireSite(site))
  let darkness: SkyDarkness = 'night'
  if (altitudeDeg > SUNSET_ALTITUDE_DEG) darkness = 'day'
  else if (altitudeDeg > CIVIL_DEG) darkness = 'civil-twilight'
  else if (altitudeDeg > NAUTICAL_DEG) darkness = 'nautical-twilight'
  else if (altitudeDeg > ASTRONOMICAL_DEG) darkness = 'astronomical-twilight'
  return { sunAltitudeDeg: altitudeDeg, darkness }
}

/**
 * Altitude (standard refraction) and azimuth of a star from its J2000 catalogue place, precessed and nutated
 * to the date. Proper motion, annual aberration and parallax (all under a minute of arc) are left out: the
 * use is a compass or clinometer check on a bright star such as Polaris.
 */
export function fixedStarPosition(star: FixedStar, at: Date, site: Site): HorizontalPosition {
  const raHours = requireNumber(star?.raHours, 'star.raHours', 0, 24)
  const decDeg = requireNumber(star?.decDeg, 'star.decDeg', -90, 90)
  const place = requireSite(site)
  const time = MakeTime(requireDate(at, 'at'))
  const ra = raHours * 15 * DEG
  const dec = decDeg * DEG
  const j2000 = new Vector(Math.cos(dec) * Math.cos(ra), Math.cos(dec) * Math.sin(ra), Math.sin(dec), time)
  const ofDate = raDecOf(RotateVector(Rotation_EQJ_EQD(time), j2000))
  const observer = new Observer(place.latitude, place.longitude, place.elevation)
  const h = Horizon(time, observer, ofDate.raDeg / 15, ofDate.decDeg, 'normal')
  return { altitudeDeg: h.altitude, azimuthDeg: h.azimuth }
}
