import type { Kysely } from 'kysely'

// A card names a listed group, so the group's columns join the card columns that the three busiest
// listings carry in their indexes (see 2026-12-02-40), and the group filter gets a keyset index of its own.
const CARD = [
  'observer_id', 'observer_name', 'age_days', 'illuminated_fraction', 'instrument_kind', 'instrument_label',
  'site_latitude', 'site_longitude', 'published_at', 'group_id', 'group_name',
]
const BEFORE = CARD.slice(0, -2)

async function cardIndexes(db: Kysely<any>, card: string[]): Promise<void> {
  for (const name of ['atlas_observed_card_idx', 'atlas_phase_card_idx', 'atlas_colongitude_card_idx']) {
    await db.schema.dropIndex(name).execute()
  }
  await db.schema.createIndex('atlas_observed_card_idx').on('atlas_entries')
    .columns(['observed_at', 'sketch_id', 'phase_name', 'colongitude_deg', ...card]).execute()
  await db.schema.createIndex('atlas_phase_card_idx').on('atlas_entries')
    .columns(['phase_name', 'observed_at', 'sketch_id', 'colongitude_deg', ...card]).execute()
  await db.schema.createIndex('atlas_colongitude_card_idx').on('atlas_entries')
    .columns(['colongitude_deg', 'sketch_id', 'observed_at', 'phase_name', ...card]).execute()
}

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  await cardIndexes(db, CARD)
  await db.schema.dropIndex('atlas_group_idx').execute()
  await db.schema.createIndex('atlas_group_key_idx').on('atlas_entries').columns(['group_id', 'observed_at', 'sketch_id']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('atlas_group_key_idx').execute()
  await db.schema.createIndex('atlas_group_idx').on('atlas_entries').columns(['group_id', 'observed_at']).execute()
  await cardIndexes(db, BEFORE)
}
