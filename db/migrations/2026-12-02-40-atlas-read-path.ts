import type { Kysely } from 'kysely'

// Every column an atlas card shows, so the busiest listings are read from one index range alone.
const CARD = [
  'observer_id', 'observer_name', 'age_days', 'illuminated_fraction', 'instrument_kind', 'instrument_label',
  'site_latitude', 'site_longitude', 'published_at',
]

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  // Each listing order ends with the entry id, so a page resumes from the last card shown (keyset) and the
  // index alone gives the order. The three listings most people read (newest first, by phase, by lighting)
  // carry every card column: one page is one contiguous index range, not a table lookup per card.
  for (const name of ['atlas_phase_idx', 'atlas_colongitude_idx', 'atlas_age_idx', 'atlas_observer_idx', 'atlas_instrument_idx', 'atlas_observed_idx']) {
    await db.schema.dropIndex(name).execute()
  }
  await db.schema.createIndex('atlas_observed_card_idx').on('atlas_entries')
    .columns(['observed_at', 'sketch_id', 'phase_name', 'colongitude_deg', ...CARD]).execute()
  await db.schema.createIndex('atlas_phase_card_idx').on('atlas_entries')
    .columns(['phase_name', 'observed_at', 'sketch_id', 'colongitude_deg', ...CARD]).execute()
  await db.schema.createIndex('atlas_colongitude_card_idx').on('atlas_entries')
    .columns(['colongitude_deg', 'sketch_id', 'observed_at', 'phase_name', ...CARD]).execute()
  await db.schema.createIndex('atlas_age_key_idx').on('atlas_entries').columns(['age_days', 'sketch_id']).execute()
  await db.schema.createIndex('atlas_observer_key_idx').on('atlas_entries').columns(['observer_id', 'observed_at', 'sketch_id']).execute()
  await db.schema.createIndex('atlas_instrument_key_idx').on('atlas_entries').columns(['instrument_kind', 'observed_at', 'sketch_id']).execute()
  // A feature's entries are found from its pins; this index orders them by date or lighting without
  // reading the entries themselves, so only the cards of the page shown are read.
  await db.schema.createIndex('atlas_sketch_keys_idx').on('atlas_entries').columns(['sketch_id', 'observed_at', 'colongitude_deg']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const name of ['atlas_observed_card_idx', 'atlas_phase_card_idx', 'atlas_colongitude_card_idx', 'atlas_age_key_idx', 'atlas_observer_key_idx', 'atlas_instrument_key_idx', 'atlas_sketch_keys_idx']) {
    await db.schema.dropIndex(name).execute()
  }
  await db.schema.createIndex('atlas_phase_idx').on('atlas_entries').columns(['phase_name', 'observed_at']).execute()
  await db.schema.createIndex('atlas_colongitude_idx').on('atlas_entries').columns(['colongitude_deg']).execute()
  await db.schema.createIndex('atlas_age_idx').on('atlas_entries').columns(['age_days']).execute()
  await db.schema.createIndex('atlas_observer_idx').on('atlas_entries').columns(['observer_id', 'observed_at']).execute()
  await db.schema.createIndex('atlas_instrument_idx').on('atlas_entries').columns(['instrument_kind', 'observed_at']).execute()
  await db.schema.createIndex('atlas_observed_idx').on('atlas_entries').columns(['observed_at']).execute()
}
