// Small vector and angle helpers for the module's own formulas.

export const DEG = Math.PI / 180

export interface Vec3 {
  x: number
  y: number
  z: number
}

export const dot = (a: Vec3, b: Vec3): number => a.x * b.x + a.y * b.y + a.z * b.z

export const cross = (a: Vec3, b: Vec3): Vec3 => ({
  x: a.y * b.z - a.z * b.y,
  y: a.z * b.x - a.x * b.z,
  z: a.x * b.y - a.y * b.x,
})

export const minus = (a: Vec3, b: Vec3): Vec3 => ({ x: a.x - b.x, y: a.y - b.y, z: a.z - b.z })

export const scale = (a: Vec3, k: number): Vec3 => ({ x: a.x * k, y: a.y * k, z: a.z * k })

export const length = (a: Vec3): number => Math.hypot(a.x, a.y, a.z)

export const unit = (a: Vec3): Vec3 => scale(a, 1 / length(a))

/** Angle between two directions; atan2 keeps precision near 0° and 180°, where acos loses it. */
export const angleBetweenDeg = (a: Vec3, b: Vec3): number => Math.atan2(length(cross(a, b)), dot(a, b)) / DEG

/** Into [0, 360). */
export function wrap360(deg: number): number {
  const r = deg % 360
  return r < 0 ? r + 360 : r + 0
}

/** Into (−180, 180]. */
export function wrap180(deg: number): number {
  const r = wrap360(deg)
  return r > 180 ? r - 360 : r
}

export interface RaDec {
  raDeg: number
  decDeg: number
}

export function raDecOf(v: Vec3): RaDec {
  return {
    raDeg: wrap360(Math.atan2(v.y, v.x) / DEG),
    decDeg: Math.atan2(v.z, Math.hypot(v.x, v.y)) / DEG,
  }
}

/**
 * Position angle of `target` as seen from the centre of `from`, measured from celestial north through east,
 * 0..360. Meeus, Astronomical Algorithms 2nd ed., ch. 48, eq. 48.5 (there with the Sun as target, giving
 * the bright limb χ): tan χ = cos δ0 sin(α0 − α) / (sin δ0 cos δ − cos δ0 sin δ cos(α0 − α)).
 */
export function positionAngleDeg(from: RaDec, target: RaDec): number {
  const da = (target.raDeg - from.raDeg) * DEG
  const d0 = target.decDeg * DEG
  const d = from.decDeg * DEG
  return wrap360(Math.atan2(
    Math.cos(d0) * Math.sin(da),
    Math.sin(d0) * Math.cos(d) - Math.cos(d0) * Math.sin(d) * Math.cos(da),
  ) / DEG)
}
