import { CampaignParams } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)

// One row per member and night, with measured, predicted and residual values. Members appear by display
// name only; no address and no member's own site.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  const db = useDb()
  const grid = await progressGrid(db, access)
  const comparison = await classComparison(db, access)
  const csv = campaignCsv(grid, comparison.members, comparison.predictions)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="shadowline-campaign-${campaignNights(access.campaign)[0]}.csv"`)
  return csv
})
