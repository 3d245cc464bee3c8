import { z } from 'zod'
import type { SketchSaved } from '#shared/sketch/api'
import { EDITABLE_SKETCH_STATUSES } from '#shared/sketch/api'
import { SKETCH_SIZE } from '#shared/sketch/frame'
import { SHAPES_SCHEMA_VERSION, SaveSketchHead, SketchIdParams, SketchShapesText } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)
const validHead = parseWith(SaveSketchHead)
const validShapes = parseWith(z.object({ shapes: SketchShapesText }))

/**
 * Saves the drawing and its raster as the next version. The save names the version it started from; if
 * another save landed since, the answer is 409 with the current version and nothing is written.
 */
export default defineEventHandler(async (event): Promise<SketchSaved> => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const sketch = await findSketch(db, user, id, 'write')
  if (!sketch) throw createError({ status: 404, message: 'No such sketch.' })
  if (!sketchIsEditable(sketch, user)) {
    throw createError({ status: 409, message: `This sketch is ${sketch.status} and can no longer be changed.` })
  }
  const upload = await parseSketchUpload(event, await readSketchBody(event, SKETCH_SAVE_MAX_BYTES))
  const save = validated(validHead, upload.fields)

  // A retried upload whose first attempt landed, though its answer was lost.
  const landed = await db.selectFrom('sketch_revisions')
    .select(['version', 'created_at', 'raster_key'])
    .where('sketch_id', '=', id)
    .where('save_id', '=', save.saveId)
    .executeTakeFirst()
  if (landed) return { id, version: landed.version, updatedAt: landed.created_at, hasRaster: landed.raster_key != null }
  if (save.baseVersion !== sketch.version) throw sketchConflict(sketch)
  if (!upload.raster) throw createError({ status: 400, message: 'The save has no raster image.' })

  // libvips works on the raster in its own threads while the drawing is checked here; nothing is stored
  // until both have passed.
  const rasterWork = prepareRaster(upload.raster, SKETCH_SIZE)
  rasterWork.catch(() => undefined)
  // The strict shapes schema admits no key it does not know, so the text is stored as sent.
  const shapes = upload.fields.shapes ?? ''
  validated(validShapes, { shapes })
  const store = useObjectStore()
  const keys = await storeRaster(store, sketchObjectPrefix(id, save.saveId), await rasterWork)
  const at = nowIso()
  const version = save.baseVersion + 1
  const saved = await db.transaction().execute(async (trx) => {
    const updated = await trx.updateTable('sketches')
      .set({
        version,
        schema_version: SHAPES_SCHEMA_VERSION,
        shapes,
        view_orientation: save.orientation,
        view_flip: save.flip,
        raster_key: keys.raster,
        thumb_small_key: keys.small,
        thumb_large_key: keys.large,
        updated_at: at,
      })
      .where('id', '=', id)
      .where('user_id', '=', user.id)
      .where('version', '=', save.baseVersion)
      .where('status', 'in', [...EDITABLE_SKETCH_STATUSES])
      .executeTakeFirst()
    if (Number(updated.numUpdatedRows) !== 1) return false
    await trx.insertInto('sketch_revisions').values({
      id: newId(),
      sketch_id: id,
      version,
      schema_version: SHAPES_SCHEMA_VERSION,
      shapes,
      view_orientation: save.orientation,
      view_flip: save.flip,
      raster_key: keys.raster,
      created_by: user.id,
      created_at: at,
      save_id: save.saveId,
    }).execute()
    return true
  })
  if (!saved) {
    // Another save won the race between the check above and this update.
    await discardRaster(store, keys)
    const current = await db.selectFrom('sketches').select(['version', 'updated_at']).where('id', '=', id).executeTakeFirstOrThrow()
    throw sketchConflict(current)
  }
  return { id, version, updatedAt: at, hasRaster: true }
})
