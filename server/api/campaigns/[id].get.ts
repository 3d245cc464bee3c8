import { CampaignParams } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)

// The campaign as every member sees it: the brief, the nights and where the Moon stands on each.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'member')
  return {
    ...campaignSummary(access.campaign, access.group, access.site),
    myRole: access.role,
    predictions: campaignPredictions(access.campaign, access.site).map(p => ({
      localDate: p.localDate, at: p.at, altitudeDeg: p.altitudeDeg, azimuthDeg: p.azimuthDeg, illuminatedFraction: p.illuminatedFraction,
    })),
  }
})
