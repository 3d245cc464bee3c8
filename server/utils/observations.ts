import type { Kysely } from 'kysely'
import type { Database, Measurement, NewObservation, Observation, Site } from '../../db/schema'
import { MAGNETIC_MODEL, magneticModelCovers } from '#shared/lunar'
import { localDateTimeOf, zonedInstant } from '#shared/observing/clock'
import { altitudeMeasurement, azimuthMeasurement, type DerivedMeasurement } from '#shared/observing/measurements'
import { COMPUTED_WITH, computeNight, type StoredCircumstances } from '#shared/observing/night'
import { describeInstrument, effectiveMagnification } from '#shared/observing/instrument'
import type { ObservationInput, ObservationListQuery } from '#shared/schemas/observation'
import type { ObservationView } from '#shared/types/observation'

type ObservationFields = Omit<NewObservation, 'id' | 'user_id' | 'created_at' | 'updated_at'>

function badField(field: string, message: string): never {
  throw createError({ status: 400, message: `${field}: ${message}`, data: { fields: { [field]: [message] } } })
}

/** Turns a form's input into the stored row and its measurements, computing everything once. */
export function buildObservation(input: ObservationInput, site: Site) {
  let at: Date
  try {
    at = zonedInstant(input.localDate, input.localTime, site.time_zone)
  }
  catch (error) {
    badField('localTime', (error as Error).message)
  }
  const night = computeNight(at, observingSite(site))
  const place = { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m }
  const measurements: DerivedMeasurement[] = []
  if (input.clinometerReadingDeg != null) {
    measurements.push(altitudeMeasurement(input.clinometerReadingDeg, night.altitudeDeg))
  }
  if (input.compassBearingDeg != null) {
    if (!magneticModelCovers(at)) {
      badField('compassBearingDeg', `The magnetic model (${MAGNETIC_MODEL.name}) covers ${MAGNETIC_MODEL.validFrom.getUTCFullYear()}–${MAGNETIC_MODEL.validUntil.getUTCFullYear() - 1}; a compass bearing on another date cannot be corrected to true north.`)
    }
    measurements.push(azimuthMeasurement(input.compassBearingDeg % 360, place, at, night.azimuthDeg))
  }
  const i = input.instrument
  const fields: ObservationFields = {
    site_id: site.id,
    observed_at: at.toISOString(),
    local_date: night.localDate,
    time_zone: site.time_zone,
    instrument_kind: i.kind,
    magnification: i.kind === 'naked-eye' ? null : i.magnification ?? null,
    aperture_mm: i.kind === 'naked-eye' ? null : i.apertureMm,
    focal_length_mm: i.kind === 'telescope' ? i.focalLengthMm ?? null : null,
    eyepiece_mm: i.kind === 'telescope' ? i.eyepieceMm ?? null : null,
    view: input.view,
    seeing: input.seeing ?? null,
    transparency: input.transparency ?? null,
    notes: input.notes,
    circumstances: JSON.stringify(night),
    computed_with: COMPUTED_WITH,
    illuminated_fraction: night.illuminatedFraction,
    age_days: night.ageDays,
    phase_name: night.phaseName,
    colongitude_deg: night.colongitudeDeg,
  }
  return { fields, measurements }
}

export async function replaceMeasurements(db: Kysely<Database>, observationId: string, measurements: DerivedMeasurement[]) {
  await db.deleteFrom('measurements').where('observation_id', '=', observationId).execute()
  if (measurements.length === 0) return
  const at = nowIso()
  await db.insertInto('measurements').values(measurements.map(m => ({
    id: newId(),
    observation_id: observationId,
    kind: m.kind,
    raw_deg: m.rawDeg,
    derived_deg: m.derivedDeg,
    predicted_deg: m.predictedDeg,
    residual_deg: m.residualDeg,
    declination_deg: m.declinationDeg,
    created_at: at,
  }))).execute()
}

/**
 * A sketch in review or in the atlas was judged against its observation's data and circumstances, so that
 * observation may then be neither changed nor deleted.
 */
export async function refuseIfJudged(db: Kysely<Database>, observationId: string, action: 'changed' | 'deleted'): Promise<void> {
  const judged = await db.selectFrom('sketches').select('id')
    .where('observation_id', '=', observationId)
    .where('status', 'in', ['submitted', 'approved'])
    .executeTakeFirst()
  if (judged) throw createError({ status: 409, message: `A sketch of this observation is in review or in the atlas; it cannot be ${action}.` })
}

/** The owner's observation, or 404. */
export async function ownObservation(userId: string, id: string): Promise<Observation> {
  const row = await useDb().selectFrom('observations').selectAll()
    .where('id', '=', id)
    .where('user_id', '=', userId)
    .executeTakeFirst()
  if (!row) throw createError({ status: 404, message: 'No such observation among yours.' })
  return row
}

function measurementDto(m: Measurement): DerivedMeasurement {
  return {
    kind: m.kind,
    rawDeg: m.raw_deg,
    derivedDeg: m.derived_deg,
    predictedDeg: m.predicted_deg,
    residualDeg: m.residual_deg,
    declinationDeg: m.declination_deg,
  }
}

export function observationDto(row: Observation, site: Pick<Site, 'id' | 'name'>, measurements: Measurement[], sketches: ObservationView['sketches'] = []): ObservationView {
  const instrument = {
    kind: row.instrument_kind,
    magnification: row.magnification,
    apertureMm: row.aperture_mm,
    focalLengthMm: row.focal_length_mm,
    eyepieceMm: row.eyepiece_mm,
  }
  const local = localDateTimeOf(new Date(row.observed_at), row.time_zone)
  const altitude = measurements.find(m => m.kind === 'altitude')
  const azimuth = measurements.find(m => m.kind === 'azimuth')
  return {
    id: row.id,
    observedAt: row.observed_at,
    localDate: row.local_date,
    localTime: local.time,
    timeZone: row.time_zone,
    site: { id: site.id, name: site.name },
    instrument,
    instrumentLabel: describeInstrument(instrument),
    magnification: effectiveMagnification(instrument),
    view: row.view,
    seeing: row.seeing,
    transparency: row.transparency,
    notes: row.notes,
    circumstances: JSON.parse(row.circumstances) as StoredCircumstances,
    computedWith: row.computed_with,
    altitude: altitude ? measurementDto(altitude) : null,
    azimuth: azimuth ? measurementDto(azimuth) : null,
    sketches,
  }
}

export type ObservationDto = ObservationView

/** Observations with their sites and measurements, in one query each. */
export async function loadObservationDtos(db: Kysely<Database>, rows: Observation[]): Promise<ObservationDto[]> {
  if (rows.length === 0) return []
  const siteIds = [...new Set(rows.map(r => r.site_id))]
  const sites = await db.selectFrom('sites').select(['id', 'name']).where('id', 'in', siteIds).execute()
  const measurements = await db.selectFrom('measurements').selectAll()
    .where('observation_id', 'in', rows.map(r => r.id))
    .execute()
  const siteById = new Map(sites.map(s => [s.id, s]))
  const sketches = await sketchesForObservations(db, rows.map(r => r.id))
  return rows.map(row => observationDto(
    row,
    siteById.get(row.site_id) ?? { id: row.site_id, name: '' },
    measurements.filter(m => m.observation_id === row.id),
    sketches.get(row.id) ?? [],
  ))
}

const SORT_COLUMNS = {
  observedAt: 'observations.observed_at',
  illuminatedFraction: 'observations.illuminated_fraction',
  ageDays: 'observations.age_days',
  colongitude: 'observations.colongitude_deg',
  site: 'sites.name',
} as const

/** The observer's observations filtered and sorted as the list asks; shared by the list and its CSV export. */
export function filteredObservations(db: Kysely<Database>, userId: string, q: ObservationListQuery) {
  let query = db.selectFrom('observations')
    .innerJoin('sites', 'sites.id', 'observations.site_id')
    .where('observations.user_id', '=', userId)
  if (q.siteId) query = query.where('observations.site_id', '=', q.siteId)
  if (q.from) query = query.where('observations.local_date', '>=', q.from)
  if (q.to) query = query.where('observations.local_date', '<=', q.to)
  if (q.phase) query = query.where('observations.phase_name', '=', q.phase)
  return {
    query,
    sorted: query.selectAll('observations')
      .orderBy(SORT_COLUMNS[q.sort], q.dir)
      .orderBy('observations.id'),
  }
}
