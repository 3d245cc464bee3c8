import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('sketches')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('observation_id', 'text', c => c.notNull().references('observations.id').onDelete('cascade'))
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('status', 'text', c => c.notNull().defaultTo('draft'))
    .addColumn('version', 'integer', c => c.notNull().defaultTo(1))
    .addColumn('schema_version', 'integer', c => c.notNull())
    .addColumn('shapes', 'text', c => c.notNull())
    .addColumn('view_orientation', 'text', c => c.notNull().defaultTo('zenith-up'))
    .addColumn('view_flip', 'text', c => c.notNull().defaultTo('none'))
    .addColumn('raster_key', 'text')
    .addColumn('thumb_small_key', 'text')
    .addColumn('thumb_large_key', 'text')
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('sketches_observation_idx').on('sketches').column('observation_id').execute()
  await db.schema.createIndex('sketches_user_idx').on('sketches').columns(['user_id', 'updated_at']).execute()
  await db.schema.createIndex('sketches_status_idx').on('sketches').columns(['status', 'updated_at']).execute()

  await db.schema
    .createTable('sketch_revisions')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('sketch_id', 'text', c => c.notNull().references('sketches.id').onDelete('cascade'))
    .addColumn('version', 'integer', c => c.notNull())
    .addColumn('schema_version', 'integer', c => c.notNull())
    .addColumn('shapes', 'text', c => c.notNull())
    .addColumn('view_orientation', 'text', c => c.notNull())
    .addColumn('view_flip', 'text', c => c.notNull())
    .addColumn('raster_key', 'text')
    .addColumn('created_by', 'text', c => c.notNull().references('users.id'))
    .addColumn('created_at', 'text', c => c.notNull())
    .addUniqueConstraint('sketch_revisions_version', ['sketch_id', 'version'])
    .execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('sketch_revisions').execute()
  await db.schema.dropTable('sketches').execute()
}
