import { defaultSketchView } from '#shared/sketch/frame'
import { CreateSketchBody, SHAPES_SCHEMA_VERSION, emptyShapes } from '#shared/sketch/schema'

const validBody = parseWith(CreateSketchBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { observationId } = await readValidatedBody(event, validBody)
  const db = useDb()
  const observation = await db.selectFrom('observations')
    .select(['id', 'view'])
    .where('id', '=', observationId)
    .where('user_id', '=', user.id)
    .executeTakeFirst()
  if (!observation) throw createError({ status: 404, message: 'No such observation.' })

  const id = newId()
  const at = nowIso()
  const view = defaultSketchView(observation.view)
  const shapes = JSON.stringify(emptyShapes())
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('sketches').values({
      id,
      observation_id: observation.id,
      user_id: user.id,
      status: 'draft',
      version: 1,
      schema_version: SHAPES_SCHEMA_VERSION,
      shapes,
      view_orientation: view.orientation,
      view_flip: view.flip,
      raster_key: null,
      thumb_small_key: null,
      thumb_large_key: null,
      created_at: at,
      updated_at: at,
    }).execute()
    // Revisions mirror versions one to one, starting with the empty page.
    await trx.insertInto('sketch_revisions').values({
      id: newId(),
      sketch_id: id,
      version: 1,
      schema_version: SHAPES_SCHEMA_VERSION,
      shapes,
      view_orientation: view.orientation,
      view_flip: view.flip,
      raster_key: null,
      checkpoint: 'created',
      created_by: user.id,
      created_at: at,
    }).execute()
  })
  await audit(db, { actorId: user.id, action: 'sketch.created', subjectType: 'sketch', subjectId: id, detail: { observationId } })
  setResponseStatus(event, 201)
  return { id }
})
