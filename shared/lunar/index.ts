// Shadowline's lunar computation: one isomorphic module for the canvas, the server and the tests.
// Conventions: angles in degrees; longitudes east positive; azimuth from true north through east; position
// angles from celestial north through east; instants are UTC Dates (TT is used only inside). Disk and view
// coordinates are described at the top of disk.ts.

export type {
  DiskFlip,
  DiskGeometry,
  DiskOrientation,
  DiskPoint,
  DiskView,
  FixedStar,
  GeocentricDisk,
  HorizontalPosition,
  LunarCircumstances,
  LunationBounds,
  PhaseEvent,
  PhaseKind,
  PhaseName,
  RiseSetTransit,
  SelenographicPoint,
  Site,
  SkyDarkness,
  SunCaution,
  TerminatorOutline,
  Twilight,
  ViewTransform,
} from './types'
export { LUNAR_MODEL_VERSION } from './version'
export { geocentricCircumstances, lunarCircumstances } from './circumstances'
export { riseSetTransit } from './riseset'
export { localDateOf, localDayBounds } from './zone'
export { lunationBounds, moonSunLongitudeDifference, phaseEvents, phaseNameAt, phaseNameFor } from './phases'
export {
  diskToSelenographic,
  positionAngleDirection,
  selenographicToDisk,
  terminatorOutline,
  viewTransform,
} from './disk'
export {
  MAGNETIC_MODEL,
  clinometerToAltitude,
  magneticDeclination,
  magneticModelCovers,
  magneticToTrueAzimuth,
} from './measure'
export {
  SUN_CAUTION_SEPARATION_DEG,
  fixedStarPosition,
  parallacticAngle,
  sunCaution,
  twilight,
} from './sky'
