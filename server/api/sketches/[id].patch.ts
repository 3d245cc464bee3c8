import type { SketchSaved } from '#shared/sketch/api'
import { SketchOperationsBody } from '#shared/sketch/operations'
import { SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)
const validBody = parseWith(SketchOperationsBody)

/**
 * An autosave: the steps since the version the editor started from (strokes added, strokes taken away,
 * turns of the view), applied to the stored drawing in one transaction. Same version check and retry id
 * as a whole-drawing save; a step that does not fit the drawing is a 400 and nothing is written.
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
  const save = validated(validBody, await readSketchJson(event))

  const landed = await landedSave(db, id, save.saveId)
  if (landed) return landed
  if (save.baseVersion !== sketch.version) throw sketchConflict(sketch)
  const current = drawingOf(sketch.shapes, { orientation: sketch.view_orientation, flip: sketch.view_flip })
  const next = applyOrRefuse(current, save.steps, sketchGeometry(sketch))
  return commitVersion(db, { sketch: { ...sketch, shapes: sketch.shapes }, user, baseVersion: save.baseVersion, saveId: save.saveId, next, steps: save.steps, reason: null })
})
