import { CampaignParams } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams)

// Leaders see every comment of the campaign; a member sees only those on their own evenings.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'member')
  const rows = await useDb().selectFrom('campaign_comments')
    .innerJoin('users as author', 'author.id', 'campaign_comments.author_id')
    .innerJoin('users as member', 'member.id', 'campaign_comments.member_id')
    .select(['campaign_comments.id', 'campaign_comments.local_date', 'campaign_comments.body', 'campaign_comments.created_at',
      'campaign_comments.member_id', 'member.name as member_name', 'author.name as author_name'])
    .where('campaign_comments.campaign_id', '=', id)
    .$if(!isLeading(access.role), q => q.where('campaign_comments.member_id', '=', user.id))
    .orderBy('campaign_comments.created_at')
    .execute()
  return rows.map(r => ({
    id: r.id,
    localDate: r.local_date,
    body: r.body,
    at: r.created_at,
    member: { id: r.member_id, name: r.member_name },
    author: r.author_name,
  }))
})
