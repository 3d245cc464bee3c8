import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'

let database: Kysely<Database> | undefined

export function setDb(db: Kysely<Database> | undefined): void {
  database = db
}

/** The one Kysely instance. Start-up (server/plugins/startup.ts) opens and migrates it. */
export function useDb(): Kysely<Database> {
  if (!database) throw createError({ status: 503, message: 'Shadowline is starting up; try again in a moment.' })
  return database
}

export function newId(): string {
  return randomUUID()
}

export function nowIso(now: Date = new Date()): string {
  return now.toISOString()
}
