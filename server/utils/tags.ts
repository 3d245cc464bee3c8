import type { User } from '../../db/schema'
import type { DiskView } from '#shared/lunar'
import type { StoredCircumstances } from '#shared/observing/night'

/** A sketch with what pins need: its view and its observation's circumstances; 404 for others' drafts. */
export async function sketchForPins(user: User, sketchId: string, access: 'read' | 'write' | 'review') {
  const db = useDb()
  const row = await findSketch(db, user, sketchId, access)
  if (!row) throw createError({ status: 404, message: 'No such sketch among yours.' })
  if (access === 'write' && !sketchIsEditable(row, user)) {
    throw createError({ status: 409, message: 'This sketch is in review or in the atlas; pins can be changed while it is a draft or returned.' })
  }
  const observation = await db.selectFrom('observations').select('circumstances').where('id', '=', row.observation_id).executeTakeFirstOrThrow()
  const view: DiskView = { orientation: row.view_orientation, flip: row.view_flip }
  return { sketch: row, view, circumstances: JSON.parse(observation.circumstances) as StoredCircumstances }
}

export async function pinsOf(sketchId: string) {
  const rows = await useDb().selectFrom('feature_tags')
    .innerJoin('features', 'features.id', 'feature_tags.feature_id')
    .select(['feature_tags.id', 'feature_tags.disk_x', 'feature_tags.disk_y', 'feature_tags.view_orientation', 'feature_tags.view_flip',
      'feature_tags.latitude', 'feature_tags.longitude', 'features.id as feature_id', 'features.name', 'features.status'])
    .where('feature_tags.sketch_id', '=', sketchId)
    .orderBy('feature_tags.created_at')
    .execute()
  return rows.map(r => ({
    id: r.id,
    x: r.disk_x,
    y: r.disk_y,
    view: { orientation: r.view_orientation, flip: r.view_flip },
    latitude: r.latitude,
    longitude: r.longitude,
    feature: { id: r.feature_id, name: r.name, status: r.status },
  }))
}

export type Pin = Awaited<ReturnType<typeof pinsOf>>[number]
