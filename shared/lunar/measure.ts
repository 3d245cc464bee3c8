// Turning the observer's hand measurements into true altitude and azimuth.

import { MODEL_EPOCH, MODEL_VALID_UNTIL, magvar } from 'magvar'
import { wrap360 } from './geometry'
import { requireDate, requireNumber, requireSite } from './validate'
import type { Site } from './types'

/**
 * A protractor clinometer (sighting straw along the straight edge, plumb line from the centre) reads 90° when
 * the straw is level and 0° when it points at the zenith, so the altitude is |reading − 90°| whichever half
 * of the scale the line crosses (common practice).
 */
export function clinometerToAltitude(protractorReadingDeg: number): number {
  return Math.abs(requireNumber(protractorReadingDeg, 'protractorReadingDeg', 0, 180) - 90)
}

/** The geomagnetic model behind compass corrections (the magvar package carries WMM2025's coefficients). */
export const MAGNETIC_MODEL = {
  name: 'WMM2025',
  validFrom: new Date(Date.UTC(MODEL_EPOCH, 0, 1)),
  validUntil: new Date(Date.UTC(MODEL_VALID_UNTIL, 0, 1)),
} as const

/** Whether the magnetic model is valid at an instant; outside it declinations are extrapolations. */
export function magneticModelCovers(at: Date): boolean {
  const ms = requireDate(at, 'at').getTime()
  return ms >= MAGNETIC_MODEL.validFrom.getTime() && ms < MAGNETIC_MODEL.validUntil.getTime()
}

/** Magnetic declination at the site (east positive): the angle from true north to magnetic north. */
export function magneticDeclination(site: Site, at: Date): number {
  const place = requireSite(site)
  return magvar(place.latitude, place.longitude, place.elevation / 1000, requireDate(at, 'at'))
}

/** A compass bearing corrected to an azimuth from true north: true = magnetic + declination. */
export function magneticToTrueAzimuth(compassBearingDeg: number, site: Site, at: Date): number {
  const bearing = requireNumber(compassBearingDeg, 'compassBearingDeg', 0, 360)
  return wrap360(bearing + magneticDeclination(site, at))
}
