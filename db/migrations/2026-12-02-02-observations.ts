import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('observations')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('site_id', 'text', c => c.notNull().references('sites.id').onDelete('restrict'))
    .addColumn('observed_at', 'text', c => c.notNull())
    .addColumn('local_date', 'text', c => c.notNull())
    .addColumn('time_zone', 'text', c => c.notNull())
    .addColumn('instrument_kind', 'text', c => c.notNull())
    .addColumn('magnification', 'double precision')
    .addColumn('aperture_mm', 'double precision')
    .addColumn('focal_length_mm', 'double precision')
    .addColumn('eyepiece_mm', 'double precision')
    .addColumn('view', 'text', c => c.notNull().defaultTo('upright'))
    .addColumn('seeing', 'integer')
    .addColumn('transparency', 'integer')
    .addColumn('notes', 'text', c => c.notNull().defaultTo(''))
    .addColumn('circumstances', 'text', c => c.notNull())
    .addColumn('computed_with', 'text', c => c.notNull())
    .addColumn('illuminated_fraction', 'double precision', c => c.notNull())
    .addColumn('age_days', 'double precision', c => c.notNull())
    .addColumn('phase_name', 'text', c => c.notNull())
    .addColumn('colongitude_deg', 'double precision', c => c.notNull())
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('observations_user_time_idx').on('observations').columns(['user_id', 'observed_at']).execute()
  await db.schema.createIndex('observations_site_idx').on('observations').column('site_id').execute()

  await db.schema
    .createTable('measurements')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('observation_id', 'text', c => c.notNull().references('observations.id').onDelete('cascade'))
    .addColumn('kind', 'text', c => c.notNull())
    .addColumn('raw_deg', 'double precision', c => c.notNull())
    .addColumn('derived_deg', 'double precision', c => c.notNull())
    .addColumn('predicted_deg', 'double precision', c => c.notNull())
    .addColumn('residual_deg', 'double precision', c => c.notNull())
    .addColumn('declination_deg', 'double precision')
    .addColumn('created_at', 'text', c => c.notNull())
    .addUniqueConstraint('measurements_one_kind', ['observation_id', 'kind'])
    .execute()

  await db.schema
    .createTable('photos')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('observation_id', 'text', c => c.notNull().references('observations.id').onDelete('cascade'))
    .addColumn('taken_at', 'text', c => c.notNull())
    .addColumn('taken_at_source', 'text', c => c.notNull())
    .addColumn('width', 'integer', c => c.notNull())
    .addColumn('height', 'integer', c => c.notNull())
    .addColumn('image_key', 'text', c => c.notNull())
    .addColumn('thumb_key', 'text', c => c.notNull())
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('photos_user_time_idx').on('photos').columns(['user_id', 'taken_at']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['photos', 'measurements', 'observations']) {
    await db.schema.dropTable(table).execute()
  }
}
