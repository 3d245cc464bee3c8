import { Migrator, type Kysely } from 'kysely'
import { migrationProvider } from './migrations'
import type { Database } from './schema'

export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
  const migrator = new Migrator({ db, provider: migrationProvider })
  const { error, results } = await migrator.migrateToLatest()
  const failed = results?.find(r => r.status === 'Error')
  if (error || failed) {
    const name = failed?.migrationName ?? 'unknown'
    throw new Error(`Database migration ${name} failed: ${error instanceof Error ? error.message : String(error)}`)
  }
  return (results ?? []).filter(r => r.status === 'Success').map(r => r.migrationName)
}
