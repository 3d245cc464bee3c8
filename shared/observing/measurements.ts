// Measured against predicted: the clinometer and the compass beside the computed place of the Moon.

import { clinometerToAltitude, magneticDeclination, magneticToTrueAzimuth, type Site } from '../lunar'

export interface DerivedMeasurement {
  kind: 'altitude' | 'azimuth'
  rawDeg: number
  derivedDeg: number
  predictedDeg: number
  residualDeg: number
  declinationDeg: number | null
}

/** Signed difference a − b folded into −180..180, so 359° against 1° is −2°, not 358°. */
export function angleDifference(a: number, b: number): number {
  return ((((a - b) % 360) + 540) % 360) - 180
}

export function altitudeMeasurement(readingDeg: number, predictedAltitudeDeg: number): DerivedMeasurement {
  const derivedDeg = clinometerToAltitude(readingDeg)
  return {
    kind: 'altitude',
    rawDeg: readingDeg,
    derivedDeg,
    predictedDeg: predictedAltitudeDeg,
    residualDeg: derivedDeg - predictedAltitudeDeg,
    declinationDeg: null,
  }
}

export function azimuthMeasurement(bearingDeg: number, site: Site, at: Date, predictedAzimuthDeg: number): DerivedMeasurement {
  const derivedDeg = magneticToTrueAzimuth(bearingDeg, site, at)
  return {
    kind: 'azimuth',
    rawDeg: bearingDeg,
    derivedDeg,
    predictedDeg: predictedAzimuthDeg,
    residualDeg: angleDifference(derivedDeg, predictedAzimuthDeg),
    declinationDeg: magneticDeclination(site, at),
  }
}

export interface OffsetEstimate {
  /** Mean residual: the constant bias of the compass (or of how it is read). */
  offsetDeg: number
  /** Sample standard deviation of the residuals about that mean; null with fewer than two nights. */
  spreadDeg: number | null
  count: number
  /** Each residual with the constant offset removed. */
  corrected: number[]
}

/**
 * A hand compass can be off by a steady few degrees (a nearby car, a misread scale); what the worksheet
 * studies is the night-to-night change, so the mean residual is estimated and removed.
 */
export function estimateConstantOffset(residualsDeg: number[]): OffsetEstimate | null {
  const n = residualsDeg.length
  if (n === 0) return null
  const mean = residualsDeg.reduce((sum, r) => sum + r, 0) / n
  const spread = n > 1 ? Math.sqrt(residualsDeg.reduce((sum, r) => sum + (r - mean) ** 2, 0) / (n - 1)) : null
  return { offsetDeg: mean, spreadDeg: spread, count: n, corrected: residualsDeg.map(r => r - mean) }
}
