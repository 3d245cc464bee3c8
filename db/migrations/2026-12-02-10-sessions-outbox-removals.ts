import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  // One row a signed-in browser: the sealed cookie names its row, and a session whose row is gone has ended.
  await db.schema
    .createTable('user_sessions')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('expires_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('user_sessions_user_idx').on('user_sessions').column('user_id').execute()

  // Until when a queued message is still worth sending (a reset link expires; a review decision does not).
  await db.schema.alterTable('mail_outbox').addColumn('useful_until', 'text').execute()

  // Stored objects whose rows are gone, removed by the outbox timer when the store could not be reached.
  await db.schema
    .createTable('object_removals')
    .addColumn('object_key', 'text', c => c.primaryKey())
    .addColumn('queued_at', 'text', c => c.notNull())
    .addColumn('attempts', 'integer', c => c.notNull().defaultTo(0))
    .execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('object_removals').execute()
  await db.schema.alterTable('mail_outbox').dropColumn('useful_until').execute()
  await db.schema.dropTable('user_sessions').execute()
}
