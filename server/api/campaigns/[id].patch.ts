import { CampaignParams, CampaignPatch } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)
const validate = parseWith(CampaignPatch)

export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  const input = await readValidatedBody(event, validate)
  const set = {
    ...(input.title !== undefined && { title: input.title }),
    ...(input.brief !== undefined && { brief: input.brief }),
    ...(input.clockTime !== undefined && { clock_time: input.clockTime }),
    ...(input.nights !== undefined && { nights: JSON.stringify([...input.nights].sort()) }),
    updated_at: nowIso(),
  }
  const db = useDb()
  await db.updateTable('campaigns').set(set).where('id', '=', id).execute()
  await audit(db, { actorId: user.id, action: 'campaign.changed', subjectType: 'campaign', subjectId: id })
  return campaignSummary({ ...access.campaign, ...set }, access.group, access.site)
})
