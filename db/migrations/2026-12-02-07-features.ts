import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('features')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('description', 'text', c => c.notNull().defaultTo(''))
    .addColumn('status', 'text', c => c.notNull().defaultTo('proposed'))
    .addColumn('proposed_by', 'text', c => c.references('users.id').onDelete('set null'))
    // A merged duplicate stays, pointing at the feature it became part of.
    .addColumn('merged_into', 'text', c => c.references('features.id'))
    .addColumn('latitude', 'double precision')
    .addColumn('longitude', 'double precision')
    .addColumn('spread_deg', 'double precision')
    .addColumn('pin_count', 'integer', c => c.notNull().defaultTo(0))
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('features_status_idx').on('features').columns(['status', 'merged_into']).execute()

  // Every name a feature answers to: its own and its aliases, with a folded key for matching.
  await db.schema
    .createTable('feature_names')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('feature_id', 'text', c => c.notNull().references('features.id'))
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('name_key', 'text', c => c.notNull())
    .addColumn('kind', 'text', c => c.notNull())
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('feature_names_feature_idx').on('feature_names').column('feature_id').execute()
  await db.schema.createIndex('feature_names_key_idx').on('feature_names').column('name_key').execute()

  // Each word of each name, for fast prefix search as the user types (an index range scan).
  await db.schema
    .createTable('feature_name_words')
    .addColumn('word', 'text', c => c.notNull())
    .addColumn('name_id', 'text', c => c.notNull().references('feature_names.id').onDelete('cascade'))
    .addPrimaryKeyConstraint('feature_name_words_pk', ['word', 'name_id'])
    .execute()

  // A trigram index in plain tables: forgiving search that runs the same on SQLite and PostgreSQL.
  await db.schema
    .createTable('feature_name_trigrams')
    .addColumn('trigram', 'text', c => c.notNull())
    .addColumn('name_id', 'text', c => c.notNull().references('feature_names.id').onDelete('cascade'))
    .addPrimaryKeyConstraint('feature_name_trigrams_pk', ['trigram', 'name_id'])
    .execute()

  // How many names hold each trigram, so a search can start from its rarest ones without counting.
  await db.schema
    .createTable('feature_trigram_counts')
    .addColumn('trigram', 'text', c => c.primaryKey())
    .addColumn('names', 'integer', c => c.notNull())
    .execute()

  await db.schema
    .createTable('feature_tags')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('sketch_id', 'text', c => c.notNull().references('sketches.id').onDelete('cascade'))
    .addColumn('feature_id', 'text', c => c.notNull().references('features.id'))
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('disk_x', 'double precision', c => c.notNull())
    .addColumn('disk_y', 'double precision', c => c.notNull())
    .addColumn('view_orientation', 'text', c => c.notNull())
    .addColumn('view_flip', 'text', c => c.notNull())
    .addColumn('latitude', 'double precision', c => c.notNull())
    .addColumn('longitude', 'double precision', c => c.notNull())
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('feature_tags_feature_idx').on('feature_tags').columns(['feature_id', 'sketch_id']).execute()
  await db.schema.createIndex('feature_tags_sketch_idx').on('feature_tags').column('sketch_id').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['feature_tags', 'feature_trigram_counts', 'feature_name_trigrams', 'feature_name_words', 'feature_names', 'features']) {
    await db.schema.dropTable(table).execute()
  }
}
