import { CampaignParams } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)

// Members × nights, for the group's leaders.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  return progressGrid(useDb(), access)
})
