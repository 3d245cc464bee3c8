import type { SketchRevisionList } from '#shared/sketch/api'
import { SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)

/**
 * The versions kept whole, newest first: one per drawing session, one every so often in a long session,
 * every submitted one, and each whole-drawing save or restore. Every version between them can be rebuilt
 * from the operations stored with it; nothing a user saved is ever overwritten.
 */
export default defineEventHandler(async (event): Promise<SketchRevisionList> => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const sketch = await findSketch(db, user, id, 'read')
  if (!sketch) throw createError({ status: 404, message: 'No such sketch.' })
  const rows = await db.selectFrom('sketch_revisions as r')
    .innerJoin('users as u', 'u.id', 'r.created_by')
    .select(['r.version', 'r.created_at', 'r.checkpoint', 'r.shapes', 'r.view_orientation', 'r.view_flip', 'u.name'])
    .where('r.sketch_id', '=', id)
    .where('r.checkpoint', 'is not', null)
    .orderBy('r.version', 'desc')
    .execute()
  setResponseHeader(event, 'cache-control', 'private, no-store')
  return {
    version: sketch.version,
    editable: sketchIsEditable(sketch, user),
    checkpoints: rows.map(row => ({
      version: row.version,
      createdAt: row.created_at,
      createdBy: row.name,
      reason: row.checkpoint!,
      strokes: drawingOf(row.shapes, { orientation: row.view_orientation, flip: row.view_flip }).strokes.length,
      view: { orientation: row.view_orientation, flip: row.view_flip },
    })),
  }
})
