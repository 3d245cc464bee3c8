import { InvitationToken } from '#shared/schemas/group'

const validQuery = parseWith(InvitationToken)

// What the join page shows before anything is decided: the group's name and the address it was sent to
// (the holder of the link received it at that address).
export default defineEventHandler(async (event) => {
  const { token } = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const invitation = await openInvitation(db, token)
  const account = await db.selectFrom('users').select('id').where('email', '=', invitation.email).executeTakeFirst()
  return { groupName: invitation.group_name, email: invitation.email, hasAccount: account != null }
})
