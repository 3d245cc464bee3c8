import { GroupParams } from '#shared/schemas/group'

const params = parseWith(GroupParams)

// A group as one of its members sees it: everyone by display name only, the group's sites and campaigns.
// Leaders also see requests waiting, open invitations (the addresses they typed) and the join code.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { group, membership } = await requireGroupRole(event, id, 'member')
  const db = useDb()
  const leading = isLeading(membership.role)
  const members = await db.selectFrom('group_members')
    .innerJoin('users', 'users.id', 'group_members.user_id')
    .select(['users.id', 'users.name', 'group_members.role', 'group_members.status'])
    .where('group_members.group_id', '=', id)
    .$if(!leading, q => q.where('group_members.status', '=', 'active'))
    .orderBy('users.name')
    .execute()
  const sites = await db.selectFrom('group_sites').selectAll().where('group_id', '=', id).orderBy('name').execute()
  const campaigns = await db.selectFrom('campaigns')
    .select(['id', 'title', 'kind', 'nights', 'clock_time'])
    .where('group_id', '=', id).orderBy('created_at', 'desc').execute()
  const invitations = leading
    ? await db.selectFrom('group_invitations')
        .select(['id', 'email', 'expires_at', 'created_at'])
        .where('group_id', '=', id).where('used_at', 'is', null).where('revoked_at', 'is', null)
        .where('expires_at', '>', nowIso())
        .orderBy('created_at', 'desc').execute()
    : []
  return {
    id: group.id,
    name: group.name,
    description: group.description,
    visibility: group.visibility,
    myRole: membership.role,
    reminders: membership.reminders === 1,
    members: members.map(m => ({ id: m.id, name: m.name, role: m.role, status: m.status })),
    sites: sites.map(groupSiteDto),
    campaigns: campaigns.map((c) => {
      const nights = JSON.parse(c.nights) as string[]
      return { id: c.id, title: c.title, kind: c.kind, clockTime: c.clock_time, first: nights[0] ?? null, last: nights.at(-1) ?? null, nights: nights.length }
    }),
    joinCode: leading ? formatJoinCode(group.join_code) : null,
    joinApproval: leading ? group.join_approval === 1 : null,
    invitations: invitations.map(i => ({ id: i.id, email: i.email, expiresAt: i.expires_at, sentAt: i.created_at })),
  }
})
