import { SignUpBody } from '#shared/schemas/auth'

const validate = parseWith(SignUpBody)

// The answer is the same whether or not the address already has an account, so
// sign-up cannot be used to find out who uses Shadowline; the owner of an existing
// account gets a note by e-mail instead.
export default defineEventHandler(async (event) => {
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const passwordHash = await hashPassword(input.password)
  const base = siteUrl(event)
  const existing = await db.selectFrom('users').selectAll().where('email', '=', input.email).executeTakeFirst()

  if (existing) {
    if (!existing.disabled_at) {
      const token = await issueToken(db, existing.id, 'reset-password')
      await sendMail(db, { to: existing.email, ...existingAccountMail(existing.name, `${base}/reset-password?token=${token}`) })
    }
  }
  else {
    const id = newId()
    const at = nowIso()
    await db.insertInto('users').values({
      id,
      email: input.email,
      name: input.name,
      password_hash: passwordHash,
      role: 'learner',
      email_verified_at: null,
      disabled_at: null,
      created_at: at,
      updated_at: at,
    }).execute()
    await audit(db, { actorId: id, action: 'user.signed-up', subjectType: 'user', subjectId: id })
    const token = await issueToken(db, id, 'verify-email')
    await sendMail(db, { to: input.email, ...verificationMail(input.name, `${base}/verify-email?token=${token}`) })
  }
  setResponseStatus(event, 202)
  return { message: 'Thank you. We sent a link to that address: open it to confirm the address, then sign in.' }
})
