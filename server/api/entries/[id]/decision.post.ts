import { IdParams } from '#shared/schemas/auth'
import { DecisionBody } from '#shared/schemas/review'

const validParams = parseWith(IdParams)
const validBody = parseWith(DecisionBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'moderator')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { decision, comment } = await readValidatedBody(event, validBody)
  return applyTransition(user, id, decision, comment, siteUrl(event))
})
