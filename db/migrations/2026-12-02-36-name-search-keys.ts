import { sql, type Kysely } from 'kysely'

// Frozen once landed: later changes go in a new, later-dated migration.
//
// Name search reads its candidates from the word and trigram indexes alone: each entry carries its name's
// folded key (which never changes for a name row), so a search scores candidates without a lookup per row
// and reads the names and features of the few best only.
export async function up(db: Kysely<any>): Promise<void> {
  for (const table of ['feature_name_words', 'feature_name_trigrams']) {
    await db.schema.alterTable(table).addColumn('name_key', 'text', c => c.notNull().defaultTo('')).execute()
    await sql`update ${sql.table(table)} set name_key = (select feature_names.name_key from feature_names where feature_names.id = ${sql.ref(`${table}.name_id`)})`.execute(db)
  }
  await db.schema.createIndex('feature_name_words_cover_idx').on('feature_name_words').columns(['word', 'name_key', 'name_id']).execute()
  await db.schema.createIndex('feature_name_trigrams_cover_idx').on('feature_name_trigrams').columns(['trigram', 'name_id', 'name_key']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('feature_name_trigrams_cover_idx').execute()
  await db.schema.dropIndex('feature_name_words_cover_idx').execute()
  for (const table of ['feature_name_words', 'feature_name_trigrams']) {
    await db.schema.alterTable(table).dropColumn('name_key').execute()
  }
}
