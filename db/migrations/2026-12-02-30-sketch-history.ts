import type { Kysely } from 'kysely'
import { sql } from 'kysely'

// Frozen once landed. Saves become the change they make: a revision row holds either the operations that
// made its version from the one before, or a checkpoint (the whole drawing), or both. Every earlier row was a
// whole drawing, so each is marked a checkpoint. The sketch's image is drawn on the server from the shapes;
// `raster_version` says which version the stored image shows, and an image of an older version is redrawn
// when it is next needed. Images uploaded with earlier saves show their own version.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('sketch_revisions').addColumn('operations', 'text').execute()
  await db.schema.alterTable('sketch_revisions').addColumn('checkpoint', 'text').execute()
  await sql`update sketch_revisions set checkpoint = 'saved'`.execute(db)
  await db.schema.alterTable('sketches').addColumn('raster_version', 'integer').execute()
  await sql`update sketches set raster_version = version where raster_key is not null`.execute(db)
  await db.schema.createIndex('sketch_revisions_checkpoint_idx').on('sketch_revisions').columns(['sketch_id', 'checkpoint', 'version']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('sketch_revisions_checkpoint_idx').execute()
  await db.schema.alterTable('sketches').dropColumn('raster_version').execute()
  await db.schema.alterTable('sketch_revisions').dropColumn('checkpoint').execute()
  await db.schema.alterTable('sketch_revisions').dropColumn('operations').execute()
}
