import type { Photo, Site } from '../../db/schema'
import { lunarCircumstances } from '#shared/lunar'
import { localDateTimeOf } from '#shared/observing/clock'
import type { PhotoView } from '#shared/schemas/photo'

const ATTACH_WINDOW_MS = 3 * 3_600_000

/** The note on an observation made to hold a photo; see dropPhotoStartedObservation. */
export const PHOTO_STARTED_NOTE = 'Started from a photo.'

/**
 * The observation a photo belongs to: the owner's nearest one at the site within three hours, else a new
 * one started from the photo (camera on a tripod, so naked-eye and upright).
 */
export async function observationForPhoto(userId: string, site: Site, takenAt: Date): Promise<string> {
  const db = useDb()
  const nearby = await db.selectFrom('observations').select(['id', 'observed_at'])
    .where('user_id', '=', userId)
    .where('site_id', '=', site.id)
    .where('observed_at', '>=', new Date(takenAt.getTime() - ATTACH_WINDOW_MS).toISOString())
    .where('observed_at', '<=', new Date(takenAt.getTime() + ATTACH_WINDOW_MS).toISOString())
    .execute()
  const nearest = nearby.sort((a, b) => Math.abs(Date.parse(a.observed_at) - takenAt.getTime()) - Math.abs(Date.parse(b.observed_at) - takenAt.getTime()))[0]
  if (nearest) return nearest.id
  const local = localDateTimeOf(takenAt, site.time_zone)
  const { fields } = buildObservation({
    siteId: site.id,
    localDate: local.date,
    localTime: local.time,
    instrument: { kind: 'naked-eye' },
    view: 'upright',
    notes: PHOTO_STARTED_NOTE,
  }, site)
  const id = newId()
  const at = nowIso()
  await db.insertInto('observations').values({ id, user_id: userId, ...fields, observed_at: takenAt.toISOString(), created_at: at, updated_at: at }).execute()
  return id
}

export function photoView(photo: Photo, site: Site): PhotoView {
  const takenAt = new Date(photo.taken_at)
  const local = localDateTimeOf(takenAt, site.time_zone)
  const c = lunarCircumstances(takenAt, { latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m })
  return {
    id: photo.id,
    observationId: photo.observation_id,
    siteId: site.id,
    siteName: site.name,
    takenAt: photo.taken_at,
    takenAtSource: photo.taken_at_source,
    localDate: local.date,
    localTime: local.time,
    width: photo.width,
    height: photo.height,
    moonAltitudeDeg: c.altitudeDeg,
    moonAzimuthDeg: c.azimuthDeg,
    illuminatedFraction: c.illuminatedFraction,
  }
}

/** The owner's photo with its site, or 404. */
export async function ownPhoto(userId: string, id: string): Promise<{ photo: Photo, site: Site }> {
  const db = useDb()
  const photo = await db.selectFrom('photos').selectAll().where('id', '=', id).where('user_id', '=', userId).executeTakeFirst()
  if (!photo) throw createError({ status: 404, message: 'No such photo among yours.' })
  const observation = await db.selectFrom('observations').select('site_id').where('id', '=', photo.observation_id).executeTakeFirstOrThrow()
  const site = await db.selectFrom('sites').selectAll().where('id', '=', observation.site_id).executeTakeFirstOrThrow()
  return { photo, site }
}
