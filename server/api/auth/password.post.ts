import { PasswordChangeBody } from '#shared/schemas/auth'

const validate = parseWith(PasswordChangeBody)

// A new password ends every other session of the account; this browser stays signed in.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const input = await readValidatedBody(event, validate)
  if (!await verifyPassword(user.password_hash, input.currentPassword)) {
    throw createError({ status: 400, message: 'currentPassword: That is not your current password.', data: { fields: { currentPassword: ['That is not your current password.'] } } })
  }
  const db = useDb()
  await db.updateTable('users')
    .set({ password_hash: await hashPassword(input.password), updated_at: nowIso() })
    .where('id', '=', user.id)
    .execute()
  const session = await getUserSession(event)
  await endSessions(db, user.id, session.sid)
  await retireTokens(db, user.id, 'reset-password')
  await audit(db, { actorId: user.id, action: 'user.password-changed', subjectType: 'user', subjectId: user.id })
  await sendMail(db, { to: user.email, ...passwordChangedMail(user.name) })
  return { message: 'Your password is changed; you were signed out everywhere else.' }
})
