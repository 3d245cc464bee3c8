import type { H3Event } from 'h3'
import type { User } from '../../db/schema'
import { hasRole, type Role } from '#shared/roles'

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
 * The one server-side check for protected routes: 401 when signed out, 403 when
 * the account's role is below `needed`. The role is read from the database on
 * every call, so a changed or disabled account takes effect at once; the session
 * cookie is refreshed when it has gone stale.
 */
export async function requireRole(event: H3Event, needed: Role): Promise<User> {
  const session = await getUserSession(event)
  if (!session.user) throw createError({ status: 401, message: 'Please sign in.' })
  const user = await useDb().selectFrom('users').selectAll()
    .where('id', '=', session.user.id)
    .where('disabled_at', 'is', null)
    .executeTakeFirst()
  if (!user) {
    await clearUserSession(event)
    throw createError({ status: 401, message: 'Please sign in.' })
  }
  if (session.user.role !== user.role || session.user.name !== user.name
    || session.user.verified !== (user.email_verified_at != null)) {
    await setUserSession(event, { user: toSessionUser(user) })
  }
  if (!hasRole(user.role, needed)) {
    throw createError({ status: 403, message: `This needs the ${needed} role.` })
  }
  return user
}

/** Base for links in e-mails: the configured public URL, else the request's origin. */
export function siteUrl(event: H3Event): string {
  const configured = useRuntimeConfig(event).public.siteUrl
  return (configured || getRequestURL(event).origin).replace(/\/$/, '')
}

export function clientAddress(event: H3Event): string {
  return getRequestIP(event, { xForwardedFor: true }) ?? 'unknown'
}
