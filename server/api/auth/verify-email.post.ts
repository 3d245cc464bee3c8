import { TokenBody } from '#shared/schemas/auth'

const validate = parseWith(TokenBody)

export default defineEventHandler(async (event) => {
  const { token } = await readValidatedBody(event, validate)
  const db = useDb()
  const userId = await consumeToken(db, token, 'verify-email')
  const user = userId
    ? await db.selectFrom('users').selectAll().where('id', '=', userId).where('disabled_at', 'is', null).executeTakeFirst()
    : undefined
  if (!user) {
    throw createError({ status: 400, message: 'This confirmation link is not valid any more. Sign in and ask for a new one.' })
  }
  const verified = await markEmailVerified(db, user)
  const session = await getUserSession(event)
  if (session.user?.id === verified.id) await setUserSession(event, { user: toSessionUser(verified) }, sessionConfig(event))
  return { message: 'Your address is confirmed.', role: verified.role }
})
