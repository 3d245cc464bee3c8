import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const [dto] = await loadObservationDtos(useDb(), [await ownObservation(user.id, id)])
  return dto
})
