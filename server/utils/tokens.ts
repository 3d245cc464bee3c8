import { createHash, randomBytes, randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database, TokenPurpose } from '../../db/schema'

const LIFETIME_MS: Record<TokenPurpose, number> = {
  'verify-email': 48 * 60 * 60 * 1000,
  'reset-password': 60 * 60 * 1000,
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

/** Issues a single-use token; only its hash is stored. */
export async function issueToken(
  db: Kysely<Database>,
  userId: string,
  purpose: TokenPurpose,
  now: Date = new Date(),
): Promise<string> {
  const token = randomBytes(32).toString('base64url')
  await db.insertInto('auth_tokens').values({
    id: randomUUID(),
    user_id: userId,
    purpose,
    token_hash: hashToken(token),
    expires_at: new Date(now.getTime() + LIFETIME_MS[purpose]).toISOString(),
    used_at: null,
    created_at: now.toISOString(),
  }).execute()
  return token
}

/**
 * Marks a token used and returns its user, or null when it is unknown, used or
 * expired. The conditional update makes a token single-use even under a race.
 */
export async function consumeToken(
  db: Kysely<Database>,
  token: string,
  purpose: TokenPurpose,
  now: Date = new Date(),
): Promise<string | null> {
  const at = now.toISOString()
  const row = await db.selectFrom('auth_tokens')
    .select(['id', 'user_id'])
    .where('token_hash', '=', hashToken(token))
    .where('purpose', '=', purpose)
    .where('used_at', 'is', null)
    .where('expires_at', '>', at)
    .executeTakeFirst()
  if (!row) return null
  const result = await db.updateTable('auth_tokens')
    .set({ used_at: at })
    .where('id', '=', row.id)
    .where('used_at', 'is', null)
    .executeTakeFirst()
  return Number(result.numUpdatedRows) === 1 ? row.user_id : null
}

/** Retires every open token of a purpose, e.g. all reset links once the password changed. */
export async function retireTokens(db: Kysely<Database>, userId: string, purpose: TokenPurpose): Promise<void> {
  await db.updateTable('auth_tokens')
    .set({ used_at: new Date().toISOString() })
    .where('user_id', '=', userId)
    .where('purpose', '=', purpose)
    .where('used_at', 'is', null)
    .execute()
}
