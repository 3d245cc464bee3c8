import type { Kysely } from 'kysely'
import { REFERENCE_FORMATIONS } from '../data/formations'
import { angularRadiusDeg } from '../../shared/features/formations'
import { nameKey } from '../../shared/features/names'
import { angularDistance } from '../../shared/features/position'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  // The IAU-named formations of the near side, shipped with the app (db/data/formations.ts).
  await db.schema
    .createTable('formations')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('name_key', 'text', c => c.notNull())
    .addColumn('kind', 'text', c => c.notNull())
    .addColumn('latitude', 'double precision', c => c.notNull())
    .addColumn('longitude', 'double precision', c => c.notNull())
    .addColumn('diameter_km', 'double precision', c => c.notNull())
    .execute()
  await db.insertInto('formations').values(REFERENCE_FORMATIONS.map(f => ({
    id: f.id,
    name: f.name,
    name_key: nameKey(f.name),
    kind: f.kind,
    latitude: f.latitude,
    longitude: f.longitude,
    diameter_km: f.diameterKm,
  }))).execute()

  // A user-named feature may point at the formation it names (set by a moderator, or when a pin takes
  // the standard name).
  await db.schema.alterTable('features').addColumn('formation_id', 'text', c => c.references('formations.id')).execute()
  await db.schema.createIndex('features_formation_idx').on('features').column('formation_id').execute()

  // Which formations' outlines hold each pin: worked out once when the pin is placed, so "every sketch
  // with a pin inside Copernicus" is an index range, whatever the pin was named.
  await db.schema
    .createTable('formation_pins')
    .addColumn('formation_id', 'text', c => c.notNull().references('formations.id'))
    .addColumn('sketch_id', 'text', c => c.notNull().references('sketches.id').onDelete('cascade'))
    .addColumn('tag_id', 'text', c => c.notNull().references('feature_tags.id').onDelete('cascade'))
    .addPrimaryKeyConstraint('formation_pins_pk', ['formation_id', 'sketch_id', 'tag_id'])
    .execute()
  await db.schema.createIndex('formation_pins_tag_idx').on('formation_pins').column('tag_id').execute()

  const tags = await db.selectFrom('feature_tags').select(['id', 'sketch_id', 'latitude', 'longitude']).execute() as
    { id: string, sketch_id: string, latitude: number, longitude: number }[]
  for (const tag of tags) {
    const inside = REFERENCE_FORMATIONS.filter(f => angularDistance({ lat: f.latitude, lon: f.longitude }, { lat: tag.latitude, lon: tag.longitude }) <= angularRadiusDeg(f))
    if (inside.length) {
      await db.insertInto('formation_pins').values(inside.map(f => ({ formation_id: f.id, sketch_id: tag.sketch_id, tag_id: tag.id }))).execute()
    }
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('formation_pins').execute()
  await db.schema.dropIndex('features_formation_idx').execute()
  await db.schema.alterTable('features').dropColumn('formation_id').execute()
  await db.schema.dropTable('formations').execute()
}
