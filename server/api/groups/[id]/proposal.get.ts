import { GroupParams } from '#shared/schemas/group'
import { ProposalQuery } from '#shared/campaigns/schema'
import { proposeCampaign } from '#shared/campaigns/propose'

const params = parseWith(GroupParams)
const validQuery = parseWith(ProposalQuery)

// The nights Shadowline suggests for a campaign at one of the group's sites.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  await requireGroupRole(event, id, 'co-leader')
  const q = await getValidatedQuery(event, validQuery)
  const site = await groupSiteOf(id, q.groupSiteId)
  return proposeCampaign(q.kind, q.from, q.days, groupObservingSite(site))
})
