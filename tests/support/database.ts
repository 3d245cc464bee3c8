import { randomBytes } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import pg from 'pg'
import type { Kysely } from 'kysely'
import { createDatabase } from '../../db/connect'
import { migrateToLatest } from '../../db/migrate'
import type { Database } from '../../db/schema'

/** The PostgreSQL cluster the server tests run against a second time, or undefined on SQLite. */
export const postgresUrl = process.env.TEST_POSTGRES_URL || undefined

export interface TestDatabase {
  /** `postgres://…` of a fresh database, or '' on SQLite (the app then uses its own file). */
  url: string
  drop(): Promise<void>
}

async function onCluster(statement: string): Promise<void> {
  const client = new pg.Client({ connectionString: postgresUrl })
  await client.connect()
  try {
    await client.query(statement)
  }
  finally {
    await client.end()
  }
}

/** A new, empty database on the test cluster; nothing on SQLite. */
export async function createTestDatabase(): Promise<TestDatabase> {
  if (!postgresUrl) return { url: '', drop: async () => undefined }
  const name = `shadowline_${randomBytes(6).toString('hex')}`
  await onCluster(`create database ${name}`)
  const url = new URL(postgresUrl)
  url.pathname = `/${name}`
  return {
    url: url.toString(),
    drop: () => onCluster(`drop database if exists ${name} with (force)`),
  }
}

/**
 * A migrated database of the dialect under test for tests that call server helpers directly: in memory on
 * SQLite, a fresh database on PostgreSQL.
 */
export async function openTestDatabase(): Promise<{ db: Kysely<Database>, close(): Promise<void> }> {
  const dir = mkdtempSync(join(tmpdir(), 'shadowline-db-'))
  const database = await createTestDatabase()
  const db = await createDatabase({ url: database.url || ':memory:', dataDir: dir })
  await migrateToLatest(db)
  return {
    db,
    async close() {
      await db.destroy()
      await database.drop()
      rmSync(dir, { recursive: true, force: true })
    },
  }
}
