import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { photo } = await ownPhoto(user.id, id)
  await useDb().deleteFrom('photos').where('id', '=', id).where('user_id', '=', user.id).execute()
  const store = useObjectStore()
  await Promise.all([store.remove(photo.image_key), store.remove(photo.thumb_key)])
  setResponseStatus(event, 204)
  return null
})
