import { setTimeout as sleep } from 'node:timers/promises'
import { SignInBody } from '#shared/schemas/auth'

const validate = parseWith(SignInBody)
const REFUSED = 'That e-mail and password do not match an account.'

export default defineEventHandler(async (event) => {
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const keys = { account: input.email, address: clientAddress(event) }

  const waitMs = await signinBlockedFor(db, keys)
  if (waitMs > 0) {
    const minutes = Math.ceil(waitMs / 60_000)
    setResponseHeader(event, 'retry-after', Math.ceil(waitMs / 1000))
    throw createError({ status: 429, message: `Too many attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.` })
  }
  const pause = await signinSlowdownFor(db, input.email)
  if (pause > 0) await sleep(pause)

  const user = await db.selectFrom('users').selectAll().where('email', '=', input.email).executeTakeFirst()
  const matches = await verifyPassword(user?.password_hash ?? await decoyPasswordHash(), input.password)
  if (!user || !matches || user.disabled_at) {
    await recordSigninFailure(db, keys)
    throw createError({ status: 401, message: REFUSED })
  }

  await clearSigninFailures(db, input.email)
  await startSession(event, user)
  await audit(db, { actorId: user.id, action: 'user.signed-in', subjectType: 'user', subjectId: user.id })
  return { user: toSessionUser(user) }
})
