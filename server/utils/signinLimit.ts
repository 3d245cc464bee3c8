import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'

// Failed sign-ins are counted in the database rather than in memory so that the
// limit holds across several app servers behind a load balancer.
export const SIGNIN_WINDOW_MS = 15 * 60 * 1000
export const SIGNIN_LIMITS = { account: 5, address: 20 } as const

type Scope = keyof typeof SIGNIN_LIMITS

export async function signinBlockedFor(
  db: Kysely<Database>,
  keys: Record<Scope, string>,
  now: Date = new Date(),
): Promise<number> {
  const since = new Date(now.getTime() - SIGNIN_WINDOW_MS).toISOString()
  let retryAfterMs = 0
  for (const scope of Object.keys(SIGNIN_LIMITS) as Scope[]) {
    const rows = await db.selectFrom('signin_failures')
      .select('at')
      .where('scope', '=', scope)
      .where('key', '=', keys[scope])
      .where('at', '>', since)
      .orderBy('at', 'asc')
      .execute()
    if (rows.length >= SIGNIN_LIMITS[scope]) {
      // Blocked until the oldest failure that still counts leaves the window.
      const oldest = new Date(rows[rows.length - SIGNIN_LIMITS[scope]]!.at).getTime()
      retryAfterMs = Math.max(retryAfterMs, oldest + SIGNIN_WINDOW_MS - now.getTime())
    }
  }
  return retryAfterMs
}

export async function recordSigninFailure(
  db: Kysely<Database>,
  keys: Record<Scope, string>,
  now: Date = new Date(),
): Promise<void> {
  const at = now.toISOString()
  await db.insertInto('signin_failures').values([
    { id: randomUUID(), scope: 'account', key: keys.account, at },
    { id: randomUUID(), scope: 'address', key: keys.address, at },
  ]).execute()
  // Old rows are useless; prune them as we go rather than with a separate job.
  await db.deleteFrom('signin_failures')
    .where('at', '<', new Date(now.getTime() - SIGNIN_WINDOW_MS).toISOString())
    .execute()
}

export async function clearSigninFailures(db: Kysely<Database>, account: string): Promise<void> {
  await db.deleteFrom('signin_failures').where('scope', '=', 'account').where('key', '=', account).execute()
}
