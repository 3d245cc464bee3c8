import type { SketchRevisionItem } from '#shared/sketch/api'
import { SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)

/** Every saved version of a sketch, newest first; nothing is ever overwritten. */
export default defineEventHandler(async (event): Promise<SketchRevisionItem[]> => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  if (!await findSketch(db, user, id, 'read')) throw createError({ status: 404, message: 'No such sketch.' })
  const rows = await db.selectFrom('sketch_revisions as r')
    .innerJoin('users as u', 'u.id', 'r.created_by')
    .select(['r.version', 'r.created_at', 'r.raster_key', 'r.view_orientation', 'r.view_flip', 'u.name'])
    .where('r.sketch_id', '=', id)
    .orderBy('r.version', 'desc')
    .execute()
  return rows.map(row => ({
    version: row.version,
    createdAt: row.created_at,
    createdBy: row.name,
    hasRaster: row.raster_key != null,
    view: { orientation: row.view_orientation, flip: row.view_flip },
  }))
})
