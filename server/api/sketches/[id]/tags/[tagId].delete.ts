import { TagParams } from '#shared/schemas/feature'

const validParams = parseWith(TagParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id, tagId } = await getValidatedRouterParams(event, validParams)
  await sketchForPins(user, id, 'write')
  const db = useDb()
  const tag = await db.selectFrom('feature_tags').select('feature_id').where('id', '=', tagId).where('sketch_id', '=', id).executeTakeFirst()
  if (!tag) throw createError({ status: 404, message: 'No such pin on this sketch.' })
  await db.deleteFrom('feature_tags').where('id', '=', tagId).execute()
  await recomputePosition(db, tag.feature_id)
  setResponseStatus(event, 204)
  return null
})
