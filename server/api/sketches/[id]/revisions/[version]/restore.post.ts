import type { SketchSaved } from '#shared/sketch/api'
import { RestoreBody, RevisionParams } from '#shared/sketch/schema'

const validParams = parseWith(RevisionParams)
const validBody = parseWith(RestoreBody)

/**
 * Brings back an earlier version as the next one, kept whole; the versions after it stay in the history.
 * The body names the version the page showed, so a restore never silently undoes a save made meanwhile (409).
 */
export default defineEventHandler(async (event): Promise<SketchSaved> => {
  const user = await requireRole(event, 'observer')
  const { id, version } = await getValidatedRouterParams(event, validParams)
  const body = await readValidatedBody(event, validBody)
  const db = useDb()
  const sketch = await findSketch(db, user, id, 'write', true)
  if (!sketch?.shapes) throw createError({ status: 404, message: 'No such sketch.' })
  if (!sketchIsEditable(sketch, user)) {
    throw createError({ status: 409, message: `This sketch is ${sketch.status} and can no longer be changed.` })
  }
  const landed = await landedSave(db, id, body.saveId)
  if (landed) return landed
  if (body.baseVersion !== sketch.version) throw sketchConflict(sketch)
  const state = await rebuildVersion(db, sketch, version)
  if (!state) throw createError({ status: 404, message: `This sketch has no version ${version}.` })
  return commitVersion(db, { sketch: { ...sketch, shapes: sketch.shapes }, user, baseVersion: body.baseVersion, saveId: body.saveId, next: state, steps: null, reason: 'restored' })
})
