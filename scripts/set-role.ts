// Sets an account's role from the command line: how the first administrator of
// a new deployment is made. Afterwards, administrators use the Accounts page.
//   npm run set-role -- --email someone@example.org --role admin
import { parseArgs } from 'node:util'
import { randomUUID } from 'node:crypto'
import { createDatabase } from '../db/connect'
import { migrateToLatest } from '../db/migrate'
import { ROLES, type Role } from '../shared/roles'

const { values } = parseArgs({ options: { email: { type: 'string' }, role: { type: 'string' } } })
const email = values.email?.trim().toLowerCase()
const role = values.role as Role | undefined
if (!email || !role || !ROLES.includes(role)) {
  console.error(`Usage: npm run set-role -- --email ADDRESS --role ${ROLES.join('|')}`)
  process.exit(2)
}

const db = await createDatabase({ url: process.env.NUXT_DATABASE_URL ?? '', dataDir: process.env.NUXT_DATA_DIR ?? '.data' })
try {
  await migrateToLatest(db)
  const user = await db.selectFrom('users').select(['id', 'role']).where('email', '=', email).executeTakeFirst()
  if (!user) {
    console.error(`No account has the address ${email}. Sign up first, then run this again.`)
    process.exitCode = 1
  }
  else {
    const at = new Date().toISOString()
    await db.updateTable('users').set({ role, updated_at: at }).where('id', '=', user.id).execute()
    await db.insertInto('audit_log').values({
      id: randomUUID(),
      at,
      actor_id: null,
      action: 'user.changed',
      subject_type: 'user',
      subject_id: user.id,
      detail: JSON.stringify({ from: { role: user.role }, to: { role }, by: 'command line' }),
    }).execute()
    console.log(`${email} is now ${role} (was ${user.role}).`)
  }
}
finally {
  await db.destroy()
}
