import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  await ownObservation(user.id, id)
  const db = useDb()
  await refuseIfJudged(db, id, 'deleted')
  // With its sketches, photos, their stored images and the pins' counts (server/utils/cleanup.ts).
  await deleteObservation(db, user.id, id)
  await audit(db, { actorId: user.id, action: 'observation.deleted', subjectType: 'observation', subjectId: id })
  setResponseStatus(event, 204)
  return null
})
