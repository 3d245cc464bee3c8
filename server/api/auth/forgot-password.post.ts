import { ForgotBody } from '#shared/schemas/auth'

const validate = parseWith(ForgotBody)

// Same answer for every address, known or not, and in the same time: the lookup, the token and the mail
// happen after the answer has gone.
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, validate)
  const base = siteUrl(event)
  event.waitUntil(sendResetLink(email, base).catch(error => console.error('[forgot-password]', error)))
  setResponseStatus(event, 202)
  return { message: 'If that address has an account, a link to choose a new password is on its way.' }
})

async function sendResetLink(email: string, base: string): Promise<void> {
  const db = useDb()
  const user = await db.selectFrom('users').selectAll()
    .where('email', '=', email)
    .where('disabled_at', 'is', null)
    .executeTakeFirst()
  if (!user) return
  const token = await issueToken(db, user.id, 'reset-password')
  await sendMail(db, { to: user.email, ...passwordResetMail(user.name, `${base}/reset-password?token=${token}`) })
  await audit(db, { actorId: null, action: 'user.reset-requested', subjectType: 'user', subjectId: user.id })
}
