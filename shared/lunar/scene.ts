// Positions of the Moon and the Sun for one instant, geocentric and as seen from a site. TT lives only here
// and in the library: callers pass UTC Dates, and astronomy-engine converts with its own ΔT model.

import {
  Body,
  GeoMoon,
  GeoVector,
  MakeTime,
  Observer,
  ObserverVector,
  RotateVector,
  Rotation_EQJ_EQD,
  Vector,
} from 'astronomy-engine'
import type { AstroTime, RotationMatrix } from 'astronomy-engine'
import type { Vec3 } from './geometry'
import type { Site } from './types'

export interface Scene {
  time: AstroTime
  observer: Observer
  /** J2000 mean equator → true equator and equinox of date. */
  toDate: RotationMatrix
  /** Geocentric, J2000 equator, AU. */
  moonGeo: Vector
  /** Geocentric apparent (light-time and aberration), J2000 equator, AU. */
  sunGeo: Vector
  /** From the site, true equator of date, AU. */
  moonTopo: Vec3
  sunTopo: Vec3
}

function relativeOfDate(target: Vector, origin: Vector, toDate: RotationMatrix, time: AstroTime): Vec3 {
  return RotateVector(toDate, new Vector(target.x - origin.x, target.y - origin.y, target.z - origin.z, time))
}

export function sceneAt(at: Date, site: Required<Site>): Scene {
  const time = MakeTime(at)
  const observer = new Observer(site.latitude, site.longitude, site.elevation)
  const toDate = Rotation_EQJ_EQD(time)
  const moonGeo = GeoMoon(time)
  const sunGeo = GeoVector(Body.Sun, time, true)
  const site2000 = ObserverVector(time, observer, false)
  return {
    time,
    observer,
    toDate,
    moonGeo,
    sunGeo,
    moonTopo: relativeOfDate(moonGeo, site2000, toDate, time),
    sunTopo: relativeOfDate(sunGeo, site2000, toDate, time),
  }
}
