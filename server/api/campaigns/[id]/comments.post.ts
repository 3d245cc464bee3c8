import { CampaignParams, CommentBody } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)
const validate = parseWith(CommentBody)

// A leader's word on one member's evening; the member reads it on the campaign page and in the day's digest.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  await requireCampaignMember(db, access, input.memberId).catch(() => {
    throw createError({ status: 400, message: 'memberId: Choose a member of the group.', data: { fields: { memberId: ['Choose a member of the group.'] } } })
  })
  if (!campaignNights(access.campaign).includes(input.localDate)) {
    throw createError({ status: 400, message: 'localDate: Choose one of the campaign\'s nights.', data: { fields: { localDate: ['Choose one of the campaign\'s nights.'] } } })
  }
  const comment = {
    id: newId(),
    campaign_id: id,
    member_id: input.memberId,
    local_date: input.localDate,
    author_id: user.id,
    body: input.body,
    digest_at: null,
    created_at: nowIso(),
  }
  await db.insertInto('campaign_comments').values(comment).execute()
  setResponseStatus(event, 201)
  return { id: comment.id, localDate: comment.local_date, body: comment.body, at: comment.created_at, author: user.name }
})
