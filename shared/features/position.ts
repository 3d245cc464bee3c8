// Where a feature is, from the pins that name it, and whether the terminator is near it tonight.

const DEG = Math.PI / 180

export interface SelenoPoint {
  lat: number
  lon: number
}

function unit(p: SelenoPoint): [number, number, number] {
  return [Math.cos(p.lat * DEG) * Math.cos(p.lon * DEG), Math.cos(p.lat * DEG) * Math.sin(p.lon * DEG), Math.sin(p.lat * DEG)]
}

/** Great-circle angle between two selenographic points, degrees. */
export function angularDistance(a: SelenoPoint, b: SelenoPoint): number {
  const [ax, ay, az] = unit(a)
  const [bx, by, bz] = unit(b)
  return Math.acos(Math.max(-1, Math.min(1, ax * bx + ay * by + az * bz))) / DEG
}

/**
 * The mean of pins on a sphere: the normalised sum of their unit vectors (an arithmetic mean of longitudes
 * would fail across ±180°), with the spread as the RMS angle of the pins from it.
 */
export function meanPosition(points: SelenoPoint[]): { lat: number, lon: number, spreadDeg: number } | null {
  if (points.length === 0) return null
  let x = 0
  let y = 0
  let z = 0
  for (const p of points) {
    const [px, py, pz] = unit(p)
    x += px
    y += py
    z += pz
  }
  const length = Math.hypot(x, y, z)
  if (length < 1e-9) return null
  const mean = { lat: Math.asin(z / length) / DEG, lon: Math.atan2(y, x) / DEG }
  const spreadDeg = Math.sqrt(points.reduce((sum, p) => sum + angularDistance(p, mean) ** 2, 0) / points.length)
  return { ...mean, spreadDeg }
}

/**
 * The sub-solar point from the Sun's colongitude c and selenographic latitude: its longitude is 90° − c
 * (Meeus, Astronomical Algorithms, ch. 53: c0 = 90° − l0). The terminator is the great circle 90° from it.
 */
export function subSolarPoint(colongitudeDeg: number, subSolarLatDeg: number): SelenoPoint {
  const lon = ((((90 - colongitudeDeg) + 180) % 360) + 360) % 360 - 180
  return { lat: subSolarLatDeg, lon }
}

/** Angular distance of a point from the terminator, degrees (0 on it). */
export function distanceFromTerminator(p: SelenoPoint, colongitudeDeg: number, subSolarLatDeg: number): number {
  return Math.abs(angularDistance(p, subSolarPoint(colongitudeDeg, subSolarLatDeg)) - 90)
}
