import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  await ownObservation(user.id, id)
  const db = useDb()
  const published = await db.selectFrom('sketches').select('id')
    .where('observation_id', '=', id)
    .where('status', 'in', ['submitted', 'approved'])
    .executeTakeFirst()
  if (published) throw createError({ status: 409, message: 'A sketch of this observation is in review or in the atlas; it cannot be deleted.' })
  await db.deleteFrom('observations').where('id', '=', id).where('user_id', '=', user.id).execute()
  await audit(db, { actorId: user.id, action: 'observation.deleted', subjectType: 'observation', subjectId: id })
  setResponseStatus(event, 204)
  return null
})
