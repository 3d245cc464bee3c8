import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { photo } = await ownPhoto(user.id, id)
  const db = useDb()
  await db.deleteFrom('photos').where('id', '=', id).where('user_id', '=', user.id).execute()
  await dropPhotoStartedObservation(db, user.id, photo.observation_id)
  await removeStoredObjects(db, [photoPrefix(user.id, id)])
  setResponseStatus(event, 204)
  return null
})
