import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Role } from '../shared/roles'
import type { Database } from './schema'

// An invented scenario for the demo: the Brackenfield Moonwatchers, a school and
// village club, its people and its observing places. None of it is real.
export const DEMO_ACCOUNTS: { role: Role, name: string, email: string, password: string }[] = [
  { role: 'admin', name: 'Sela Ortsby', email: 'admin@shadowline.test', password: 'moonlit-admin' },
  { role: 'moderator', name: 'Bram Toller', email: 'moderator@shadowline.test', password: 'moonlit-moderator' },
  { role: 'observer', name: 'Idris Fenwright', email: 'observer@shadowline.test', password: 'moonlit-observer' },
  { role: 'learner', name: 'Juno Marsh-Ellery', email: 'learner@shadowline.test', password: 'moonlit-learner' },
]

export const DEMO_SITES = [
  { owner: 'observer@shadowline.test', name: 'Brackenfield school playing field', latitude: 52.634, longitude: -1.692, elevation_m: 95, time_zone: 'Europe/London' },
  { owner: 'observer@shadowline.test', name: 'Harrier Hill lay-by', latitude: 52.712, longitude: -1.811, elevation_m: 160, time_zone: 'Europe/London' },
  { owner: 'moderator@shadowline.test', name: 'Toller back garden', latitude: 52.598, longitude: -1.655, elevation_m: 88, time_zone: 'Europe/London' },
  { owner: 'admin@shadowline.test', name: 'Cape Wattle lookout', latitude: -34.21, longitude: 18.47, elevation_m: 40, time_zone: 'Africa/Johannesburg' },
]

/** Seeds the demo once, into an empty database. Returns whether it seeded. */
export async function seedDemo(
  db: Kysely<Database>,
  hashPassword: (password: string) => Promise<string>,
  now: Date = new Date(),
): Promise<boolean> {
  const existing = await db.selectFrom('users').select('id').limit(1).executeTakeFirst()
  if (existing) return false
  const at = now.toISOString()
  const ids = new Map<string, string>()
  for (const account of DEMO_ACCOUNTS) {
    const id = randomUUID()
    ids.set(account.email, id)
    await db.insertInto('users').values({
      id,
      email: account.email,
      name: account.name,
      password_hash: await hashPassword(account.password),
      role: account.role,
      email_verified_at: account.role === 'learner' ? null : at,
      disabled_at: null,
      created_at: at,
      updated_at: at,
    }).execute()
  }
  for (const { owner, ...site } of DEMO_SITES) {
    await db.insertInto('sites').values({
      id: randomUUID(),
      user_id: ids.get(owner)!,
      ...site,
      created_at: at,
      updated_at: at,
    }).execute()
  }
  await db.insertInto('audit_log').values({
    id: randomUUID(),
    at,
    actor_id: null,
    action: 'demo.seeded',
    subject_type: 'database',
    subject_id: null,
    detail: JSON.stringify({ accounts: DEMO_ACCOUNTS.length, sites: DEMO_SITES.length }),
  }).execute()
  return true
}
