import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('users')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('email', 'text', c => c.notNull().unique())
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('password_hash', 'text', c => c.notNull())
    .addColumn('role', 'text', c => c.notNull().defaultTo('learner'))
    .addColumn('email_verified_at', 'text')
    .addColumn('disabled_at', 'text')
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()

  await db.schema
    .createTable('sites')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('latitude', 'double precision', c => c.notNull())
    .addColumn('longitude', 'double precision', c => c.notNull())
    .addColumn('elevation_m', 'double precision', c => c.notNull().defaultTo(0))
    .addColumn('time_zone', 'text', c => c.notNull())
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('sites_user_idx').on('sites').column('user_id').execute()

  await db.schema
    .createTable('auth_tokens')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('purpose', 'text', c => c.notNull())
    .addColumn('token_hash', 'text', c => c.notNull().unique())
    .addColumn('expires_at', 'text', c => c.notNull())
    .addColumn('used_at', 'text')
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('auth_tokens_user_idx').on('auth_tokens').columns(['user_id', 'purpose']).execute()

  await db.schema
    .createTable('signin_failures')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('scope', 'text', c => c.notNull())
    .addColumn('key', 'text', c => c.notNull())
    .addColumn('at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('signin_failures_key_idx').on('signin_failures').columns(['scope', 'key', 'at']).execute()

  await db.schema
    .createTable('mail_outbox')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('to_address', 'text', c => c.notNull())
    .addColumn('subject', 'text', c => c.notNull())
    .addColumn('text_body', 'text', c => c.notNull())
    .addColumn('attempts', 'integer', c => c.notNull().defaultTo(0))
    .addColumn('next_attempt_at', 'text', c => c.notNull())
    .addColumn('lease_until', 'text')
    .addColumn('sent_at', 'text')
    .addColumn('failed_at', 'text')
    .addColumn('last_error', 'text')
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('mail_outbox_due_idx').on('mail_outbox').columns(['sent_at', 'failed_at', 'next_attempt_at']).execute()

  await db.schema
    .createTable('audit_log')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('at', 'text', c => c.notNull())
    .addColumn('actor_id', 'text')
    .addColumn('action', 'text', c => c.notNull())
    .addColumn('subject_type', 'text', c => c.notNull())
    .addColumn('subject_id', 'text')
    .addColumn('detail', 'text')
    .execute()
  await db.schema.createIndex('audit_log_at_idx').on('audit_log').column('at').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['audit_log', 'mail_outbox', 'signin_failures', 'auth_tokens', 'sites', 'users']) {
    await db.schema.dropTable(table).execute()
  }
}
