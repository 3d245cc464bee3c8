const PAUSE_MS = 60_000

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  if (user.email_verified_at) return { message: 'Your address is already confirmed.' }
  const db = useDb()
  const recent = await db.selectFrom('auth_tokens').select('created_at')
    .where('user_id', '=', user.id)
    .where('purpose', '=', 'verify-email')
    .where('created_at', '>', new Date(Date.now() - PAUSE_MS).toISOString())
    .executeTakeFirst()
  if (recent) throw createError({ status: 429, message: 'A link was sent less than a minute ago; please check your inbox.' })
  const token = await issueToken(db, user.id, 'verify-email')
  await sendMail(db, { to: user.email, ...verificationMail(user.name, `${siteUrl(event)}/verify-email?token=${token}`) })
  return { message: 'A new confirmation link is on its way.' }
})
