import { mkdirSync } from 'node:fs'
import { dirname, resolve } from 'node:path'
import { Kysely, SqliteDialect, type Dialect } from 'kysely'
import type { Database } from './schema'

export interface DatabaseConfig {
  /** `postgres://…` selects PostgreSQL; anything else (or empty) is a SQLite file path. */
  url: string
  dataDir: string
}

// The only dialect-specific code in the project. Queries elsewhere stick to what
// Kysely renders for both SQLite and PostgreSQL.
async function createDialect(config: DatabaseConfig): Promise<Dialect> {
  if (/^postgres(ql)?:\/\//.test(config.url)) {
    const { default: pg } = await import('pg')
    const { PostgresDialect } = await import('kysely')
    return new PostgresDialect({ pool: new pg.Pool({ connectionString: config.url, max: 10 }) })
  }
  const { default: SQLite } = await import('better-sqlite3')
  const file = config.url === ':memory:'
    ? ':memory:'
    : resolve(config.url || resolve(config.dataDir, 'shadowline.sqlite'))
  if (file !== ':memory:') mkdirSync(dirname(file), { recursive: true })
  const sqlite = new SQLite(file)
  sqlite.pragma('journal_mode = WAL')
  sqlite.pragma('foreign_keys = ON')
  sqlite.pragma('busy_timeout = 5000')
  // The README's promise: a change the app has answered for survives a crash of the app, the machine or its
  // power. In WAL mode NORMAL may lose the last commits on a power cut; FULL syncs the log at every commit.
  sqlite.pragma('synchronous = FULL')
  return new SqliteDialect({ database: sqlite })
}

export async function createDatabase(config: DatabaseConfig): Promise<Kysely<Database>> {
  return new Kysely<Database>({ dialect: await createDialect(config) })
}
