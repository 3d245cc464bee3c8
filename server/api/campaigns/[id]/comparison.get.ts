import { CampaignParams } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)

export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  return classComparison(useDb(), access)
})
