import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  await sketchForPins(user, id, 'review')
  return pinsOf(id)
})
