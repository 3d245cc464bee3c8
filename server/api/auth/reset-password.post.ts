import { ResetBody } from '#shared/schemas/auth'

const validate = parseWith(ResetBody)

export default defineEventHandler(async (event) => {
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const userId = await consumeToken(db, input.token, 'reset-password')
  const user = userId
    ? await db.selectFrom('users').selectAll().where('id', '=', userId).where('disabled_at', 'is', null).executeTakeFirst()
    : undefined
  if (!user) {
    throw createError({ status: 400, message: 'This reset link is not valid any more. Ask for a new one.' })
  }
  await db.updateTable('users')
    .set({ password_hash: await hashPassword(input.password), updated_at: nowIso() })
    .where('id', '=', user.id)
    .execute()
  await retireTokens(db, user.id, 'reset-password')
  // Whoever knew the old password is signed out everywhere.
  await endSessions(db, user.id)
  await clearSigninFailures(db, user.email)
  // Opening the e-mailed link proves the address as well.
  await markEmailVerified(db, user)
  await audit(db, { actorId: user.id, action: 'user.password-reset', subjectType: 'user', subjectId: user.id })
  await sendMail(db, { to: user.email, ...passwordChangedMail(user.name) })
  await clearUserSession(event, sessionConfig(event))
  return { message: 'Your password is changed. Sign in with the new one.' }
})
