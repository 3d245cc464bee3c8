import { GroupParams } from '#shared/schemas/group'
import { CampaignBody } from '#shared/campaigns/schema'
import { defaultClockTime } from '#shared/campaigns/propose'

const params = parseWith(GroupParams)
const validate = parseWith(CampaignBody)

export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { user, group } = await requireGroupRole(event, id, 'co-leader')
  const input = await readValidatedBody(event, validate)
  const site = await groupSiteOf(id, input.groupSiteId).catch(() => {
    throw createError({ status: 400, message: 'groupSiteId: Choose one of the group\'s sites.', data: { fields: { groupSiteId: ['Choose one of the group\'s sites.'] } } })
  })
  const nights = [...input.nights].sort()
  // By default the end of civil twilight (or start of morning twilight) of the first night, rounded.
  const clockTime = input.clockTime ?? defaultClockTime(input.kind, nights[0]!, groupObservingSite(site))
  const at = nowIso()
  const campaign = {
    id: newId(),
    group_id: id,
    title: input.title,
    brief: input.brief,
    kind: input.kind,
    group_site_id: site.id,
    clock_time: clockTime,
    nights: JSON.stringify(nights),
    asks_sketch: input.asks.sketch ? 1 : 0,
    asks_altitude: input.asks.altitude ? 1 : 0,
    asks_azimuth: input.asks.azimuth ? 1 : 0,
    reminder_minutes: input.reminderMinutes,
    created_by: user.id,
    created_at: at,
    updated_at: at,
  }
  const db = useDb()
  await db.insertInto('campaigns').values(campaign).execute()
  await audit(db, { actorId: user.id, action: 'campaign.created', subjectType: 'campaign', subjectId: campaign.id })
  setResponseStatus(event, 201)
  return campaignSummary(campaign, group, site)
})
