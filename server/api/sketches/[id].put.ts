import type { SketchSaved } from '#shared/sketch/api'
import { FullSaveBody, SaveSketchFields, SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)
const validBody = parseWith(FullSaveBody)
const validFields = parseWith(SaveSketchFields)

/**
 * Saves the whole drawing as the next version: the first save of an editor that has lost track of the
 * server's copy, or "keep mine" after a conflict (autosaves send only their changes, PATCH). The save names
 * the version it started from; if another save landed since, the answer is 409 and nothing is written.
 * The image is drawn from the shapes when it is next needed; an uploaded image is never used.
 */
export default defineEventHandler(async (event): Promise<SketchSaved> => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const sketch = await findSketch(db, user, id, 'write', true)
  if (!sketch?.shapes) throw createError({ status: 404, message: 'No such sketch.' })
  if (!sketchIsEditable(sketch, user)) {
    throw createError({ status: 409, message: `This sketch is ${sketch.status} and can no longer be changed.` })
  }
  const multipart = /^multipart\/form-data;/i.test(getRequestHeader(event, 'content-type') ?? '')
  const save = multipart
    ? validated(validFields, await readLegacyUpload(event, await readSketchBody(event, SKETCH_SAVE_MAX_BYTES)))
    : validated(validBody, await readSketchJson(event))

  const landed = await landedSave(db, id, save.saveId)
  if (landed) return landed
  if (save.baseVersion !== sketch.version) throw sketchConflict(sketch)
  return commitVersion(db, {
    sketch: { ...sketch, shapes: sketch.shapes },
    user,
    baseVersion: save.baseVersion,
    saveId: save.saveId,
    next: { strokes: save.shapes.strokes, view: { orientation: save.orientation, flip: save.flip } },
    steps: null,
    reason: 'full',
  })
})
