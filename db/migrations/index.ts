import type { Migration, MigrationProvider } from 'kysely'
import * as foundation from './2026-12-02-01-foundation'
import * as observations from './2026-12-02-02-observations'
import * as sketches from './2026-12-02-03-sketches'
import * as sketchSaveId from './2026-12-02-05-sketch-save-id'
import * as review from './2026-12-02-06-review'
import * as features from './2026-12-02-07-features'
import * as sessionsOutboxRemovals from './2026-12-02-10-sessions-outbox-removals'
import * as groups from './2026-12-02-20-groups'
import * as sketchHistory from './2026-12-02-30-sketch-history'
import * as formations from './2026-12-02-35-formations'
import * as nameSearchKeys from './2026-12-02-36-name-search-keys'
import * as atlasReadPath from './2026-12-02-40-atlas-read-path'
import * as atlasGroupCards from './2026-12-02-41-atlas-group-cards'

// Migrations are imported statically so they survive the server bundle.
// Add each new migration here under its file name; names sort by date.
export const migrations: Record<string, Migration> = {
  '2026-12-02-01-foundation': foundation,
  '2026-12-02-02-observations': observations,
  '2026-12-02-03-sketches': sketches,
  '2026-12-02-05-sketch-save-id': sketchSaveId,
  '2026-12-02-06-review': review,
  '2026-12-02-07-features': features,
  '2026-12-02-10-sessions-outbox-removals': sessionsOutboxRemovals,
  '2026-12-02-20-groups': groups,
  '2026-12-02-30-sketch-history': sketchHistory,
  '2026-12-02-35-formations': formations,
  '2026-12-02-36-name-search-keys': nameSearchKeys,
  '2026-12-02-40-atlas-read-path': atlasReadPath,
  '2026-12-02-41-atlas-group-cards': atlasGroupCards,
}

export const migrationProvider: MigrationProvider = {
  getMigrations: async () => migrations,
}
