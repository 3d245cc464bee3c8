import type { Kysely } from 'kysely'
import type { Database, User } from '../../db/schema'

/** A confirmed address turns a learner into an observer; higher roles stay as they are. */
export async function markEmailVerified(db: Kysely<Database>, user: User, now: Date = new Date()): Promise<User> {
  if (user.email_verified_at) return user
  const at = now.toISOString()
  const role = user.role === 'learner' ? 'observer' : user.role
  await db.updateTable('users')
    .set({ email_verified_at: at, role, updated_at: at })
    .where('id', '=', user.id)
    .execute()
  await audit(db, { actorId: user.id, action: 'user.verified', subjectType: 'user', subjectId: user.id, detail: { role } })
  return { ...user, email_verified_at: at, role }
}

let decoy: Promise<string> | undefined

/** Checked against when no account matches, so both answers take as long. */
export function decoyPasswordHash(): Promise<string> {
  decoy ??= hashPassword('decoy password that matches nothing')
  return decoy
}
