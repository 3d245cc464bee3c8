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

  // Which published entries pin each feature, with the entry's date and colongitude copied beside it, so
  // a feature's listing is one index range in either order however many entries pin it. Kept by the code
  // that publishes and pins (server/utils/atlas.ts, refreshFeatureEntries); gone with its entry.
  await db.schema
    .createTable('atlas_feature_entries')
    .addColumn('feature_id', 'text', c => c.notNull().references('features.id'))
    .addColumn('entry_id', 'text', c => c.notNull().references('atlas_entries.sketch_id').onDelete('cascade'))
    .addColumn('entry_observed_at', 'text', c => c.notNull())
    .addColumn('entry_colongitude_deg', 'double precision', c => c.notNull())
    .addPrimaryKeyConstraint('atlas_feature_entries_pk', ['feature_id', 'entry_id'])
    .execute()
  await db.schema.createIndex('atlas_feature_entries_observed_idx').on('atlas_feature_entries').columns(['feature_id', 'entry_observed_at', 'entry_id']).execute()
  await db.schema.createIndex('atlas_feature_entries_colongitude_idx').on('atlas_feature_entries').columns(['feature_id', 'entry_colongitude_deg', 'entry_id']).execute()
  await db.schema.createIndex('atlas_feature_entries_entry_idx').on('atlas_feature_entries').column('entry_id').execute()
  await db.insertInto('atlas_feature_entries')
    .columns(['feature_id', 'entry_id', 'entry_observed_at', 'entry_colongitude_deg'])
    .expression(db.selectFrom('feature_tags')
      .innerJoin('atlas_entries', 'atlas_entries.sketch_id', 'feature_tags.sketch_id')
      .select(['feature_tags.feature_id', 'atlas_entries.sketch_id', 'atlas_entries.observed_at', 'atlas_entries.colongitude_deg'])
      .distinct())
    .execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('atlas_feature_entries').execute()
  for (const name of ['atlas_observed_card_idx', 'atlas_phase_card_idx', 'atlas_colongitude_card_idx', 'atlas_age_key_idx', 'atlas_observer_key_idx', 'atlas_instrument_key_idx']) {
    await db.schema.dropIndex(name).execute()
  }
  await db.schema.createIndex('atlas_phase_idx').on('atlas_entries').columns(['phase_name', 'observed_at']).execute()
  await db.schema.createIndex('atlas_colongitude_idx').on('atlas_entries').columns(['colongitude_deg']).execute()
  await db.schema.createIndex('atlas_age_idx').on('atlas_entries').columns(['age_days']).execute()
  await db.schema.createIndex('atlas_observer_idx').on('atlas_entries').columns(['observer_id', 'observed_at']).execute()
  await db.schema.createIndex('atlas_instrument_idx').on('atlas_entries').columns(['instrument_kind', 'observed_at']).execute()
  await db.schema.createIndex('atlas_observed_idx').on('atlas_entries').columns(['observed_at']).execute()
}
