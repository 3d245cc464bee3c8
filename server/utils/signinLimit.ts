import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'

// Failed sign-ins are counted in the database rather than in memory so that the limit holds across several
// app servers behind a load balancer. (rate-limiter-flexible would need a different store, with its own
// tables outside our migrations, for each dialect; three counts in one table do the job on both.)
//
// - `pair` (one account from one address) blocks the guesser at that address after a few tries;
// - `address` blocks one address guessing across many accounts;
// - the account on its own is never blocked, so nobody can lock an owner out from elsewhere: past
//   ACCOUNT_SLOWDOWN_AFTER failures from anywhere, each further attempt on it is answered more slowly.
export const SIGNIN_WINDOW_MS = 15 * 60 * 1000
export const SIGNIN_LIMITS = { pair: 5, address: 20 } as const
export const ACCOUNT_SLOWDOWN_AFTER = 10
const SLOWDOWN_STEP_MS = 500
const SLOWDOWN_MAX_MS = 5000

export interface SigninKeys {
  account: string
  address: string
}

type Blocking = keyof typeof SIGNIN_LIMITS

function keyFor(scope: Blocking | 'account', keys: SigninKeys): string {
  if (scope === 'pair') return `${keys.account}\n${keys.address}`
  return keys[scope]
}

async function failuresSince(db: Kysely<Database>, scope: Blocking | 'account', key: string, since: string) {
  return db.selectFrom('signin_failures')
    .select('at')
    .where('scope', '=', scope)
    .where('key', '=', key)
    .where('at', '>', since)
    .orderBy('at', 'asc')
    .execute()
}

/** How long this account and address must wait before another try, in ms; 0 when they may try now. */
export async function signinBlockedFor(db: Kysely<Database>, keys: SigninKeys, now: Date = new Date()): Promise<number> {
  const since = new Date(now.getTime() - SIGNIN_WINDOW_MS).toISOString()
  let retryAfterMs = 0
  for (const scope of Object.keys(SIGNIN_LIMITS) as Blocking[]) {
    const rows = await failuresSince(db, scope, keyFor(scope, keys), since)
    if (rows.length >= SIGNIN_LIMITS[scope]) {
      // Blocked until the oldest failure that still counts leaves the window.
      const oldest = new Date(rows[rows.length - SIGNIN_LIMITS[scope]]!.at).getTime()
      retryAfterMs = Math.max(retryAfterMs, oldest + SIGNIN_WINDOW_MS - now.getTime())
    }
  }
  return retryAfterMs
}

/** The pause before answering a sign-in to an account under attack from many addresses, in ms. */
export async function signinSlowdownFor(db: Kysely<Database>, account: string, now: Date = new Date()): Promise<number> {
  const since = new Date(now.getTime() - SIGNIN_WINDOW_MS).toISOString()
  const failures = (await failuresSince(db, 'account', account, since)).length
  if (failures < ACCOUNT_SLOWDOWN_AFTER) return 0
  return Math.min(SLOWDOWN_MAX_MS, (failures - ACCOUNT_SLOWDOWN_AFTER + 1) * SLOWDOWN_STEP_MS)
}

export async function recordSigninFailure(db: Kysely<Database>, keys: SigninKeys, now: Date = new Date()): Promise<void> {
  const at = now.toISOString()
  await db.insertInto('signin_failures').values((['account', 'address', 'pair'] as const).map(scope => ({
    id: randomUUID(),
    scope,
    key: keyFor(scope, keys),
    at,
  }))).execute()
  // Old rows are useless; prune them as we go rather than with a separate job.
  await db.deleteFrom('signin_failures')
    .where('at', '<', new Date(now.getTime() - SIGNIN_WINDOW_MS).toISOString())
    .execute()
}

/** After a good sign-in or a new password: this account's failures no longer count. */
export async function clearSigninFailures(db: Kysely<Database>, account: string): Promise<void> {
  await db.deleteFrom('signin_failures')
    .where(eb => eb.or([
      eb.and([eb('scope', '=', 'account'), eb('key', '=', account)]),
      eb.and([eb('scope', '=', 'pair'), startsWithLike('key', `${account}\n`)]),
    ]))
    .execute()
}
