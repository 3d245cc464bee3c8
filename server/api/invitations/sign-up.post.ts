import { InvitationSignUpBody } from '#shared/schemas/group'

const validate = parseWith(InvitationSignUpBody)

// An invitee without an account signs up from the link: the link proves the address, so the account is
// confirmed at once, joins the group and is signed in.
export default defineEventHandler(async (event) => {
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const invitation = await openInvitation(db, input.token)
  const existing = await db.selectFrom('users').select('id').where('email', '=', invitation.email).executeTakeFirst()
  if (existing) throw createError({ status: 409, message: 'This address already has an account: sign in, then open the link again to join.' })
  const passwordHash = await hashPassword(input.password)
  const id = newId()
  const at = nowIso()
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('users').values({
      id,
      email: invitation.email,
      name: input.name,
      password_hash: passwordHash,
      role: 'observer',
      email_verified_at: at,
      disabled_at: null,
      created_at: at,
      updated_at: at,
    }).execute()
    await useInvitation(trx, invitation.id, id)
  })
  await addMember(db, invitation.group_id, id, 'active')
  const user = await db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
  await startSession(event, user)
  await audit(db, { actorId: id, action: 'user.signed-up-by-invitation', subjectType: 'group', subjectId: invitation.group_id })
  setResponseStatus(event, 201)
  return { groupId: invitation.group_id, name: invitation.group_name, user: toSessionUser(user) }
})
