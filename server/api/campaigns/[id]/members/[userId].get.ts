import { CampaignMemberParams } from '#shared/campaigns/schema'
import { estimateConstantOffset } from '#shared/observing/measurements'
import { lunationNights, trendNotes } from '#shared/observing/worksheet'
import { zonedInstant } from '#shared/observing/clock'
import type { WorksheetView } from '#shared/types/worksheet'

const params = parseWith(CampaignMemberParams)

// A member's lunation worksheet as a leader reads it: only what was logged for this campaign (at the
// group's site, on its nights), read-only, and only while both are in the group.
export default defineEventHandler(async (event): Promise<WorksheetView & { member: { id: string, name: string } }> => {
  const { id, userId } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  const db = useDb()
  const member = await requireCampaignMember(db, access, userId)
  const rows = await campaignObservations(db, access.campaign, userId)
    .selectAll('observations')
    .orderBy('observations.observed_at')
    .execute()
  const observations = await loadObservationDtos(db, rows)
  const site = access.site
  const nights = campaignNights(access.campaign)
  const { previousNewMoon, nextNewMoon } = lunationNights(zonedInstant(nights[0]!, '12:00', site.time_zone), site.time_zone)
  const predicted = campaignPredictions(access.campaign, site)
  return {
    member,
    site: { id: site.id, name: site.name, latitude: site.latitude, longitude: site.longitude, elevation: site.elevation_m, timeZone: site.time_zone },
    sites: [],
    previousNewMoon: previousNewMoon.toISOString(),
    nextNewMoon: nextNewMoon.toISOString(),
    clockTime: access.campaign.clock_time,
    nights: predicted,
    // The member's own site names stay theirs: the leader sees the group site's name.
    observations: observations.map(o => ({ ...o, site: { id: site.id, name: site.name } })),
    compassOffset: estimateConstantOffset(observations.flatMap(o => (o.azimuth ? [o.azimuth.residualDeg] : []))),
    notes: trendNotes(predicted, access.campaign.clock_time),
  }
})
