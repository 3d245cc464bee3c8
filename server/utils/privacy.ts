import type { ExpressionBuilder } from 'kysely'
import type { Database } from '../../db/schema'
import type { DerivedMeasurement } from '#shared/observing/measurements'
import { computeNight } from '#shared/observing/night'
import type { ObservationView } from '#shared/types/observation'

// What each role may see of someone else's work, in one place. Drafts are their owner's alone (the sketch
// routes check ownership in SQL through findSketch); a reviewer sees a submitted entry as the review needs
// it and no more: the place rounded as in the atlas and instants to the minute, because precise times and
// topocentric angles give the observing site back to a hundredth of a degree.

/** Statuses in which a sketch has been shown to someone else: its pins may speak for a proposed name. */
export const SHOWN_SKETCH_STATUSES = ['submitted', 'approved'] as const

/**
 * Features the viewer may see: confirmed ones, proposed ones that a pin on a submitted or published sketch
 * supports, and the viewer's own proposals. A name proposed on a private draft stays private.
 */
export function featureIsVisible(viewerId: string | null) {
  return (eb: ExpressionBuilder<Database, 'features'>) => eb.or([
    eb('features.status', '=', 'confirmed'),
    ...(viewerId ? [eb('features.proposed_by', '=', viewerId)] : []),
    eb.exists(eb.selectFrom('feature_tags')
      .innerJoin('sketches', 'sketches.id', 'feature_tags.sketch_id')
      .select('feature_tags.id')
      .whereRef('feature_tags.feature_id', '=', 'features.id')
      .where('sketches.status', 'in', [...SHOWN_SKETCH_STATUSES])),
  ])
}

/** To the minute, as ISO 8601 UTC. */
export function toMinute(iso: string): string
export function toMinute(iso: string | null): string | null
export function toMinute(iso: string | null): string | null {
  if (!iso) return iso
  const at = new Date(iso)
  at.setUTCSeconds(0, 0)
  return at.toISOString()
}

const tenth = (deg: number) => Math.round(deg * 10) / 10

function roundedMeasurement(m: DerivedMeasurement | null): DerivedMeasurement | null {
  if (!m) return m
  return {
    ...m,
    predictedDeg: tenth(m.predictedDeg),
    residualDeg: tenth(m.residualDeg),
    declinationDeg: m.declinationDeg == null ? null : tenth(m.declinationDeg),
  }
}

/**
 * An observation as a reviewer (not its owner) sees it: the circumstances computed again for the site
 * rounded to 0.1° (as the atlas shows it) at sea level and for the minute, rise/transit/set to the minute,
 * predicted angles to 0.1°, and no site name or id (an owner's "back garden" is theirs).
 */
export function observationForReviewer(dto: ObservationView, site: { latitude: number, longitude: number }): ObservationView {
  const minute = toMinute(dto.observedAt)
  const rounded = { latitude: roundedCoordinate(site.latitude), longitude: roundedCoordinate(site.longitude), elevation: 0, timeZone: dto.timeZone }
  const night = computeNight(new Date(minute), rounded)
  const circumstances = {
    ...night,
    moon: { rise: toMinute(night.moon.rise), transit: toMinute(night.moon.transit), set: toMinute(night.moon.set) },
    sun: { rise: toMinute(night.sun.rise), transit: toMinute(night.sun.transit), set: toMinute(night.sun.set) },
  }
  return {
    ...dto,
    observedAt: minute,
    localTime: dto.localTime.slice(0, 5),
    site: { id: '', name: `near ${rounded.latitude}°, ${rounded.longitude}°` },
    circumstances,
    altitude: roundedMeasurement(dto.altitude),
    azimuth: roundedMeasurement(dto.azimuth),
  }
}
