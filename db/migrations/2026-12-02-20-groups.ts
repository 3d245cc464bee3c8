import type { Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
export async function up(db: Kysely<any>): Promise<void> {
  // A class, a club or a family. Group roles (leader, co-leader, member) live on the membership and are
  // separate from the account roles.
  await db.schema
    .createTable('groups')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('description', 'text', c => c.notNull().defaultTo(''))
    .addColumn('visibility', 'text', c => c.notNull().defaultTo('private'))
    // Shown to a class by its leader, so it is kept as it is; null when switched off.
    .addColumn('join_code', 'text', c => c.unique())
    .addColumn('join_approval', 'integer', c => c.notNull().defaultTo(0))
    .addColumn('created_by', 'text', c => c.notNull().references('users.id'))
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()

  await db.schema
    .createTable('group_members')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('group_id', 'text', c => c.notNull().references('groups.id').onDelete('cascade'))
    .addColumn('user_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('role', 'text', c => c.notNull())
    .addColumn('status', 'text', c => c.notNull())
    .addColumn('reminders', 'integer', c => c.notNull().defaultTo(0))
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .addUniqueConstraint('group_members_group_user_unique', ['group_id', 'user_id'])
    .execute()
  await db.schema.createIndex('group_members_user_idx').on('group_members').columns(['user_id', 'status']).execute()

  // Places the group observes from; members pick them instead of typing coordinates.
  await db.schema
    .createTable('group_sites')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('group_id', 'text', c => c.notNull().references('groups.id').onDelete('cascade'))
    .addColumn('name', 'text', c => c.notNull())
    .addColumn('latitude', 'double precision', c => c.notNull())
    .addColumn('longitude', 'double precision', c => c.notNull())
    .addColumn('elevation_m', 'double precision', c => c.notNull())
    .addColumn('time_zone', 'text', c => c.notNull())
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('group_sites_group_idx').on('group_sites').columns(['group_id']).execute()

  // A member's own copy of a group site: observations keep pointing at the member's sites, and what a
  // leader may see is exactly what was logged at the group's place.
  await db.schema.alterTable('sites').addColumn('group_site_id', 'text').execute()
  await db.schema.createIndex('sites_group_site_idx').on('sites').columns(['group_site_id', 'user_id']).execute()
  // The progress grid reads a campaign's observations site by site and night by night, each with its
  // sketches' statuses: covering indexes keep that to index reads.
  await db.schema.createIndex('observations_site_date_idx').on('observations').columns(['site_id', 'local_date', 'user_id']).execute()
  await db.schema.createIndex('sketches_observation_status_idx').on('sketches').columns(['observation_id', 'status']).execute()

  await db.schema
    .createTable('group_invitations')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('group_id', 'text', c => c.notNull().references('groups.id').onDelete('cascade'))
    .addColumn('email', 'text', c => c.notNull())
    .addColumn('token_hash', 'text', c => c.notNull().unique())
    .addColumn('invited_by', 'text', c => c.notNull().references('users.id'))
    .addColumn('expires_at', 'text', c => c.notNull())
    .addColumn('used_at', 'text')
    .addColumn('used_by', 'text')
    .addColumn('revoked_at', 'text')
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('group_invitations_group_idx').on('group_invitations').columns(['group_id', 'created_at']).execute()

  await db.schema
    .createTable('campaigns')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('group_id', 'text', c => c.notNull().references('groups.id').onDelete('cascade'))
    .addColumn('title', 'text', c => c.notNull())
    .addColumn('brief', 'text', c => c.notNull().defaultTo(''))
    .addColumn('kind', 'text', c => c.notNull())
    .addColumn('group_site_id', 'text', c => c.notNull().references('group_sites.id'))
    .addColumn('clock_time', 'text', c => c.notNull())
    // JSON array of the local dates (at the site) the campaign asks for, in order.
    .addColumn('nights', 'text', c => c.notNull())
    .addColumn('asks_sketch', 'integer', c => c.notNull())
    .addColumn('asks_altitude', 'integer', c => c.notNull())
    .addColumn('asks_azimuth', 'integer', c => c.notNull())
    .addColumn('reminder_minutes', 'integer', c => c.notNull().defaultTo(60))
    .addColumn('created_by', 'text', c => c.notNull().references('users.id'))
    .addColumn('created_at', 'text', c => c.notNull())
    .addColumn('updated_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('campaigns_group_idx').on('campaigns').columns(['group_id', 'created_at']).execute()

  await db.schema
    .createTable('campaign_comments')
    .addColumn('id', 'text', c => c.primaryKey())
    .addColumn('campaign_id', 'text', c => c.notNull().references('campaigns.id').onDelete('cascade'))
    .addColumn('member_id', 'text', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('local_date', 'text', c => c.notNull())
    .addColumn('author_id', 'text', c => c.notNull().references('users.id'))
    .addColumn('body', 'text', c => c.notNull())
    .addColumn('digest_at', 'text')
    .addColumn('created_at', 'text', c => c.notNull())
    .execute()
  await db.schema.createIndex('campaign_comments_member_idx').on('campaign_comments').columns(['member_id', 'digest_at']).execute()
  await db.schema.createIndex('campaign_comments_campaign_idx').on('campaign_comments').columns(['campaign_id', 'member_id']).execute()

  // One row per reminder or digest sent, so none goes out twice (unique key).
  await db.schema
    .createTable('campaign_mail_log')
    .addColumn('key', 'text', c => c.primaryKey())
    .addColumn('sent_at', 'text', c => c.notNull())
    .execute()

  // The atlas names a listed group beside its members' entries; the name is null while the group is private.
  await db.schema.alterTable('atlas_entries').addColumn('group_id', 'text').execute()
  await db.schema.alterTable('atlas_entries').addColumn('group_name', 'text').execute()
  await db.schema.createIndex('atlas_group_idx').on('atlas_entries').columns(['group_id', 'observed_at']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('atlas_group_idx').execute()
  await db.schema.alterTable('atlas_entries').dropColumn('group_name').execute()
  await db.schema.alterTable('atlas_entries').dropColumn('group_id').execute()
  await db.schema.dropTable('campaign_mail_log').execute()
  await db.schema.dropTable('campaign_comments').execute()
  await db.schema.dropTable('campaigns').execute()
  await db.schema.dropTable('group_invitations').execute()
  await db.schema.dropIndex('sketches_observation_status_idx').execute()
  await db.schema.dropIndex('observations_site_date_idx').execute()
  await db.schema.dropIndex('sites_group_site_idx').execute()
  await db.schema.alterTable('sites').dropColumn('group_site_id').execute()
  await db.schema.dropTable('group_sites').execute()
  await db.schema.dropTable('group_members').execute()
  await db.schema.dropTable('groups').execute()
}
