import { InvitationToken } from '#shared/schemas/group'

const validate = parseWith(InvitationToken)

// A signed-in invitee joins; the invitation was addressed to one account's e-mail and only it may use it.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { token } = await readValidatedBody(event, validate)
  const db = useDb()
  const invitation = await openInvitation(db, token)
  if (invitation.email !== user.email) {
    throw createError({ status: 403, message: 'This invitation was sent to another e-mail address. Sign in with that account to accept it.' })
  }
  await useInvitation(db, invitation.id, user.id)
  await addMember(db, invitation.group_id, user.id, 'active')
  // The link reached this address, which confirms it as well.
  const verified = await markEmailVerified(db, user)
  await setUserSession(event, { user: toSessionUser(verified) }, sessionConfig(event))
  await audit(db, { actorId: user.id, action: 'group.invitation-accepted', subjectType: 'group', subjectId: invitation.group_id })
  return { groupId: invitation.group_id, name: invitation.group_name }
})
