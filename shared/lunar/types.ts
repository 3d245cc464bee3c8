// Public shapes of the lunar computation. Every angle is in degrees, every instant a UTC `Date`.

/** An observing place: geodetic latitude (north +), longitude (east +), elevation in metres above sea level. */
export interface Site {
  latitude: number
  longitude: number
  elevation?: number
}

export type PhaseName
  = | 'new'
    | 'waxing-crescent'
    | 'first-quarter'
    | 'waxing-gibbous'
    | 'full'
    | 'waning-gibbous'
    | 'last-quarter'
    | 'waning-crescent'

export type PhaseKind = 'new' | 'first-quarter' | 'full' | 'last-quarter'

export interface PhaseEvent {
  kind: PhaseKind
  at: Date
}

/**
 * The Moon as seen from one site at one instant. Plain numbers, booleans and strings only, so it can be
 * stored as JSON beside an observation. Disk quantities (fraction, limb, librations, axis) are topocentric:
 * they describe the disk the observer actually saw, which differs from the almanac's geocentric figures by up
 * to about a degree of libration. Age, phase name and waxing are geocentric, as lunations are.
 */
export interface LunarCircumstances {
  /** Illuminated fraction of the disk, 0..1. */
  illuminatedFraction: number
  /** Angle Sun–Moon–observer. */
  phaseAngleDeg: number
  /** Angle Sun–observer–Moon, 0..180. */
  elongationDeg: number
  waxing: boolean
  /** Days since the previous new moon. */
  ageDays: number
  phaseName: PhaseName
  /** Position angle of the midpoint of the bright limb, from celestial north through east, 0..360. */
  brightLimbAngleDeg: number
  /** Position angle of the zenith at the Moon, −180..180; rotates a north-up disk to the zenith-up view. */
  parallacticAngleDeg: number
  /** Position angle of the Moon's north rotation pole (P), −180..180. */
  axisAngleDeg: number
  /** Selenographic longitude of the sub-observer point, east positive, −180..180. */
  librationLonDeg: number
  /** Selenographic latitude of the sub-observer point. */
  librationLatDeg: number
  /** The Sun's selenographic colongitude, 0..360: about 0 at first quarter, 90 at full, 180 at last quarter. */
  colongitudeDeg: number
  /** The Sun's selenographic latitude. */
  subSolarLatDeg: number
  /** Topocentric altitude of the Moon's centre, with standard refraction. */
  altitudeDeg: number
  /** Topocentric azimuth from true north through east, 0..360. */
  azimuthDeg: number
  /** Site to the Moon's centre. */
  distanceKm: number
  apparentDiameterDeg: number
  /** The computation that produced these numbers; see LUNAR_MODEL_VERSION. */
  modelVersion: string
}

/** The same disk quantities for a viewpoint at the Earth's centre, as printed in almanacs. */
export type GeocentricDisk = Pick<
  LunarCircumstances,
  | 'illuminatedFraction'
  | 'phaseAngleDeg'
  | 'elongationDeg'
  | 'brightLimbAngleDeg'
  | 'axisAngleDeg'
  | 'librationLonDeg'
  | 'librationLatDeg'
  | 'colongitudeDeg'
  | 'subSolarLatDeg'
  | 'distanceKm'
  | 'apparentDiameterDeg'
>

/** What the disk drawing and the pin projection need; a stored circumstances object satisfies it. */
export type DiskGeometry = Pick<
  LunarCircumstances,
  | 'illuminatedFraction'
  | 'brightLimbAngleDeg'
  | 'parallacticAngleDeg'
  | 'axisAngleDeg'
  | 'librationLonDeg'
  | 'librationLatDeg'
>

export type DiskOrientation = 'north-up' | 'zenith-up'
/** Applied after orientation: 'inverted' turns the view 180° (no diagonal), 'mirrored' swaps left and right (star diagonal). */
export type DiskFlip = 'none' | 'inverted' | 'mirrored'

export interface DiskView {
  orientation: DiskOrientation
  flip: DiskFlip
}

/** A point on or in the unit disk, x to the right and y up as the observer sees the view. */
export interface DiskPoint {
  x: number
  y: number
}

/** Selenographic coordinates: latitude north positive, longitude east positive (toward Mare Crisium), −180..180. */
export interface SelenographicPoint {
  lat: number
  lon: number
}

export interface TerminatorOutline {
  /** Closed polygon of the lit region (the last point joins the first), view coordinates, y up. */
  litPath: DiskPoint[]
  /** The terminator half-ellipse from one cusp to the other. */
  terminator: DiskPoint[]
  /** Unit vector from the centre toward the midpoint of the bright limb. */
  brightLimbDir: DiskPoint
}

/**
 * A view as a 2×2 linear map from the position-angle frame (north-up, no flip: celestial north +y, east −x)
 * to view coordinates: x′ = a·x + b·y, y′ = c·x + d·y. To draw position-angle-frame shapes on a canvas of
 * disk radius r px centred at (cx, cy), whose y grows downward: ctx.setTransform(r·a, −r·c, r·b, −r·d, cx, cy).
 */
export interface ViewTransform {
  a: number
  b: number
  c: number
  d: number
  toView: (p: DiskPoint) => DiskPoint
  fromView: (p: DiskPoint) => DiskPoint
}

export interface RiseSetTransit {
  rise: Date | null
  transit: Date | null
  set: Date | null
}

export interface LunationBounds {
  previousNewMoon: Date
  nextNewMoon: Date
}

export interface SunCaution {
  sunUp: boolean
  /** Geometric altitude of the Sun's centre (no refraction). */
  sunAltitudeDeg: number
  moonSunSeparationDeg: number
  /** True when the Sun is up or the Moon is within SUN_CAUTION_SEPARATION_DEG of it. */
  warn: boolean
}

export type SkyDarkness = 'day' | 'civil-twilight' | 'nautical-twilight' | 'astronomical-twilight' | 'night'

export interface Twilight {
  sunAltitudeDeg: number
  darkness: SkyDarkness
}

export interface HorizontalPosition {
  altitudeDeg: number
  azimuthDeg: number
}

/** A star's catalogue position, J2000 mean equator and equinox. */
export interface FixedStar {
  raHours: number
  decDeg: number
}
