import { IdParams } from '#shared/schemas/auth'
import { PhotoImageQuery } from '#shared/schemas/photo'

const validParams = parseWith(IdParams)
const validQuery = parseWith(PhotoImageQuery)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { size } = await getValidatedQuery(event, validQuery)
  const { photo } = await ownPhoto(user.id, id)
  return sendStoredObject(event, size === 'full' ? photo.image_key : photo.thumb_key)
})
