import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  // Every change of an entry's status, kept for good: who, when, from, to and why.
  await db.schema
    .createTable('sketch_reviews')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('sketch_id', 'text', c => c.notNull().references('sketches.id').onDelete('cascade'))
    .addColumn('actor_id', 'text', c => c.notNull().references('users.id'))
    .addColumn('from_status', 'text', c => c.notNull())
    .addColumn('to_status', 'text', c => c.notNull())
    .addColumn('comment', 'text', c => c.notNull().defaultTo(''))
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('sketch_reviews_sketch_idx').on('sketch_reviews').columns(['sketch_id', 'created_at']).execute()

  await db.schema.alterTable('sketches').addColumn('submitted_at', 'text').execute()

  // The published atlas as its own read model: one row per approved entry, written on approval and
  // removed on withdrawal, holding only what the public may see (the site rounded to 0.1°).
  await db.schema
    .createTable('atlas_entries')
    .addColumn('sketch_id', 'text', c => c.primaryKey().references('sketches.id').onDelete('cascade'))
    .addColumn('observer_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('observer_name', 'text', c => c.notNull())
    .addColumn('observed_at', 'text', c => c.notNull())
    .addColumn('age_days', 'double precision', c => c.notNull())
    .addColumn('phase_name', 'text', c => c.notNull())
    .addColumn('colongitude_deg', 'double precision', c => c.notNull())
    .addColumn('illuminated_fraction', 'double precision', c => c.notNull())
    .addColumn('instrument_kind', 'text', c => c.notNull())
    .addColumn('instrument_label', 'text', c => c.notNull())
    .addColumn('site_latitude', 'double precision', c => c.notNull())
    .addColumn('site_longitude', 'double precision', c => c.notNull())
    .addColumn('published_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('atlas_phase_idx').on('atlas_entries').columns(['phase_name', 'observed_at']).execute()
  await db.schema.createIndex('atlas_colongitude_idx').on('atlas_entries').columns(['colongitude_deg']).execute()
  await db.schema.createIndex('atlas_age_idx').on('atlas_entries').columns(['age_days']).execute()
  await db.schema.createIndex('atlas_observer_idx').on('atlas_entries').columns(['observer_id', 'observed_at']).execute()
  await db.schema.createIndex('atlas_instrument_idx').on('atlas_entries').columns(['instrument_kind', 'observed_at']).execute()
  await db.schema.createIndex('atlas_observed_idx').on('atlas_entries').columns(['observed_at']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('atlas_entries').execute()
  await db.schema.alterTable('sketches').dropColumn('submitted_at').execute()
  await db.schema.dropTable('sketch_reviews').execute()
}
