import type { Kysely } from 'kysely'

// Frozen once landed. A save carries an id chosen by the editor; a retried upload whose first attempt did
// land (the answer was lost with the network) is then recognised instead of being refused as stale.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('sketch_revisions').addColumn('save_id', 'text').execute()
  await db.schema.createIndex('sketch_revisions_save_idx').on('sketch_revisions').columns(['sketch_id', 'save_id']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('sketch_revisions_save_idx').execute()
  await db.schema.alterTable('sketch_revisions').dropColumn('save_id').execute()
}
