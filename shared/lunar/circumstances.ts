// The Moon's circumstances for an instant: phase, orientation of the disk, librations, lighting, position.

import {
  Body,
  GeoMoon,
  GeoVector,
  Horizon,
  KM_PER_AU,
  MakeTime,
  RotateVector,
  Rotation_EQJ_ECT,
  Rotation_EQJ_EQD,
  SiderealTime,
} from 'astronomy-engine'
import { DEG, angleBetweenDeg, length, minus, positionAngleDeg, raDecOf, scale, wrap180, wrap360 } from './geometry'
import type { Vec3 } from './geometry'
import { moonFrame, selenographicPointToward } from './orientation'
import type { MoonFrame } from './orientation'
import { moonAgeDays, phaseNameFor } from './phases'
import { sceneAt } from './scene'
import type { Scene } from './scene'
import { parallacticAngle } from './sky'
import { requireDate, requireSite } from './validate'
import { LUNAR_MODEL_VERSION } from './version'
import type { GeocentricDisk, LunarCircumstances, Site } from './types'

// IAU mean radius of the Moon (WGCCRE 2009 report, Archinal et al. 2011), as astronomy-engine uses.
const MOON_RADIUS_KM = 1737.4

/** Disk quantities for a viewpoint; `moon` and `sun` point from it, in the true equator of date. */
function diskSeenFrom(moon: Vec3, sun: Vec3, frame: MoonFrame): GeocentricDisk {
  const moonToViewer = scale(moon, -1)
  const moonToSun = minus(sun, moon)
  const phaseAngleDeg = angleBetweenDeg(moonToSun, moonToViewer)
  const moonPlace = raDecOf(moon)
  const subSolar = selenographicPointToward(moonToSun, frame)
  const subViewer = selenographicPointToward(moonToViewer, frame)
  const distanceKm = length(moon) * KM_PER_AU
  return {
    // Meeus, Astronomical Algorithms 2nd ed., ch. 48, eq. 48.1: k = (1 + cos i) / 2.
    illuminatedFraction: (1 + Math.cos(phaseAngleDeg * DEG)) / 2,
    phaseAngleDeg,
    elongationDeg: angleBetweenDeg(sun, moon),
    brightLimbAngleDeg: positionAngleDeg(moonPlace, raDecOf(sun)),
    // P is the position angle of the projected rotation axis (Meeus ch. 53), here the same eq. 48.5 aimed at
    // the pole's direction instead of the Sun.
    axisAngleDeg: wrap180(positionAngleDeg(moonPlace, raDecOf(frame.pole))),
    librationLonDeg: subViewer.lon,
    librationLatDeg: subViewer.lat,
    // Meeus ch. 53: colongitude c0 = 90° − l0, l0 the Sun's selenographic longitude.
    colongitudeDeg: wrap360(90 - subSolar.lon),
    subSolarLatDeg: subSolar.lat,
    distanceKm,
    apparentDiameterDeg: 2 * Math.asin(MOON_RADIUS_KM / distanceKm) / DEG,
  }
}

/** Geocentric Moon − Sun difference in apparent ecliptic longitude of date (0 new, 180 full). */
function phaseLongitudeDeg(scene: Scene): number {
  const toEcliptic = Rotation_EQJ_ECT(scene.time)
  const moon = RotateVector(toEcliptic, scene.moonGeo)
  const sun = RotateVector(toEcliptic, scene.sunGeo)
  return wrap360((Math.atan2(moon.y, moon.x) - Math.atan2(sun.y, sun.x)) / DEG)
}

export function lunarCircumstances(at: Date, site: Site): LunarCircumstances {
  const when = requireDate(at, 'at')
  const place = requireSite(site)
  const scene = sceneAt(when, place)
  const disk = diskSeenFrom(scene.moonTopo, scene.sunTopo, moonFrame(scene.time, scene.toDate))
  const moonPlace = raDecOf(scene.moonTopo)
  const horizontal = Horizon(scene.time, scene.observer, moonPlace.raDeg / 15, moonPlace.decDeg, 'normal')
  const hourAngleDeg = SiderealTime(scene.time) * 15 + place.longitude - moonPlace.raDeg
  const longitudeDifference = phaseLongitudeDeg(scene)
  return {
    illuminatedFraction: disk.illuminatedFraction,
    phaseAngleDeg: disk.phaseAngleDeg,
    elongationDeg: disk.elongationDeg,
    waxing: longitudeDifference < 180,
    ageDays: moonAgeDays(scene.time),
    phaseName: phaseNameFor(longitudeDifference),
    brightLimbAngleDeg: disk.brightLimbAngleDeg,
    parallacticAngleDeg: parallacticAngle(hourAngleDeg, moonPlace.decDeg, place.latitude),
    axisAngleDeg: disk.axisAngleDeg,
    librationLonDeg: disk.librationLonDeg,
    librationLatDeg: disk.librationLatDeg,
    colongitudeDeg: disk.colongitudeDeg,
    subSolarLatDeg: disk.subSolarLatDeg,
    altitudeDeg: horizontal.altitude,
    azimuthDeg: horizontal.azimuth,
    distanceKm: disk.distanceKm,
    apparentDiameterDeg: disk.apparentDiameterDeg,
    modelVersion: LUNAR_MODEL_VERSION,
  }
}

/** The disk as seen from the Earth's centre, the way almanacs tabulate it. */
export function geocentricCircumstances(at: Date): GeocentricDisk {
  const time = MakeTime(requireDate(at, 'at'))
  const toDate = Rotation_EQJ_EQD(time)
  const moon = RotateVector(toDate, GeoMoon(time))
  const sun = RotateVector(toDate, GeoVector(Body.Sun, time, true))
  return diskSeenFrom(moon, sun, moonFrame(time, toDate))
}
