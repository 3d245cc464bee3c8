import { GroupParams, InviteBody } from '#shared/schemas/group'

const params = parseWith(GroupParams)
const validate = parseWith(InviteBody)

// One single-use link per address, through the outbox; only the link's hash is kept.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { user, group } = await requireGroupRole(event, id, 'co-leader')
  const { emails } = await readValidatedBody(event, validate)
  const db = useDb()
  const base = siteUrl(event)
  const now = new Date()
  const unique = [...new Set(emails)]
  for (const email of unique) {
    const token = newInvitationToken()
    await db.insertInto('group_invitations').values({
      id: newId(),
      group_id: id,
      email,
      token_hash: hashToken(token),
      invited_by: user.id,
      expires_at: new Date(now.getTime() + INVITATION_LIFETIME_MS).toISOString(),
      used_at: null,
      used_by: null,
      revoked_at: null,
      created_at: now.toISOString(),
    }).execute()
    await sendMail(db, { to: email, ...invitationMail(group.name, user.name, `${base}/groups/join?token=${token}`) })
  }
  await audit(db, { actorId: user.id, action: 'group.invited', subjectType: 'group', subjectId: id, detail: { count: unique.length } })
  setResponseStatus(event, 201)
  return { invited: unique.length }
})
