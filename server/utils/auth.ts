import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Kysely } from 'kysely'
import type { Database, User } from '../../db/schema'
import { hasRole, type Role } from '#shared/roles'

/** As long as the sealed cookie lives (nuxt.config.ts session.maxAge). */
export const SESSION_LIFETIME_MS = 14 * 24 * 60 * 60 * 1000

export function toSessionUser(user: User) {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    verified: user.email_verified_at != null,
  }
}

/**
 * The cookie is `Secure` whenever the browser reached us over https (directly, or through a trusted proxy),
 * or the configured public address is https. On plain http a `Secure` cookie would be dropped by the browser
 * and every sign-in would seem to fail.
 */
export function sessionConfig(event: H3Event) {
  return { cookie: { secure: requestIsSecure(event) } }
}

/** Signs the user in on this browser: a new server-side session that the cookie names. */
export async function startSession(event: H3Event, user: User, now: Date = new Date()): Promise<void> {
  const db = useDb()
  const sid = randomBytes(24).toString('base64url')
  await db.insertInto('user_sessions').values({
    id: sid,
    user_id: user.id,
    created_at: now.toISOString(),
    expires_at: new Date(now.getTime() + SESSION_LIFETIME_MS).toISOString(),
  }).execute()
  await db.deleteFrom('user_sessions').where('expires_at', '<', now.toISOString()).execute()
  await replaceUserSession(event, { user: toSessionUser(user), sid, loggedInAt: now.toISOString() }, sessionConfig(event))
}

/** Ends this browser's session: its row goes, so a copy of the cookie is worthless too. */
export async function endSession(event: H3Event): Promise<void> {
  const session = await getUserSession(event)
  if (session.sid) await useDb().deleteFrom('user_sessions').where('id', '=', session.sid).execute()
  await clearUserSession(event, sessionConfig(event))
}

/** Ends every session of an account, but for `keep` (the browser that asked) when given. */
export async function endSessions(db: Kysely<Database>, userId: string, keep?: string): Promise<void> {
  await db.deleteFrom('user_sessions')
    .where('user_id', '=', userId)
    .$if(keep !== undefined, qb => qb.where('id', '!=', keep!))
    .execute()
}

/**
 * The signed-in account behind this request, or null: the cookie's session must still exist and the account
 * be enabled. Read from the database on every call, so a changed role, a disabled account or an ended session
 * takes effect at once.
 */
export async function currentUser(event: H3Event): Promise<User | null> {
  const session = await getUserSession(event)
  if (!session.user) return null
  const user = session.sid
    ? await useDb().selectFrom('users')
        .innerJoin('user_sessions', 'user_sessions.user_id', 'users.id')
        .selectAll('users')
        .where('user_sessions.id', '=', session.sid)
        .where('users.id', '=', session.user.id)
        .where('user_sessions.expires_at', '>', nowIso())
        .where('users.disabled_at', 'is', null)
        .executeTakeFirst()
    : undefined
  if (!user) {
    await clearUserSession(event, sessionConfig(event))
    return null
  }
  if (session.user.role !== user.role || session.user.name !== user.name
    || session.user.verified !== (user.email_verified_at != null)) {
    await setUserSession(event, { user: toSessionUser(user) }, sessionConfig(event))
  }
  return user
}

/**
 * The one server-side check for protected routes: 401 when signed out (or the session has ended), 403 when
 * the account's role is below `needed`.
 */
export async function requireRole(event: H3Event, needed: Role): Promise<User> {
  const user = await currentUser(event)
  if (!user) throw createError({ status: 401, message: 'Please sign in.' })
  if (!hasRole(user.role, needed)) {
    throw createError({ status: 403, message: `This needs the ${needed} role.` })
  }
  return user
}

/** Base for links in e-mails: the configured public URL, else the request's origin. */
export function siteUrl(event: H3Event): string {
  const configured = useRuntimeConfig(event).public.siteUrl
  return (configured || `${requestIsSecure(event) ? 'https' : 'http'}://${getRequestHost(event)}`).replace(/\/$/, '')
}
