import type { Migration, MigrationProvider } from 'kysely'
import * as foundation from './2026-12-02-01-foundation'

// Migrations are imported statically so they survive the server bundle.
// Add each new migration here under its file name; names sort by date.
export const migrations: Record<string, Migration> = {
  '2026-12-02-01-foundation': foundation,
}

export const migrationProvider: MigrationProvider = {
  getMigrations: async () => migrations,
}
