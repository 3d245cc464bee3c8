import { sql, type RawBuilder } from 'kysely'

// LIKE treats % and _ as wildcards; searching for "ray_c" must find only that text. The wildcards (and the
// escape character itself) are escaped, and the ESCAPE clause says with what: neither SQLite nor PostgreSQL
// takes a backslash as the escape unless told (SQLite has none by default).
const ESCAPE = '!'

export function escapeLike(text: string): string {
  return text.replace(/[!%_]/g, m => `${ESCAPE}${m}`)
}

/** `column` contains `text`, ignoring case: the one way every search box matches text. */
export function containsLike(column: string, text: string): RawBuilder<boolean> {
  return sql<boolean>`lower(${sql.ref(column)}) like ${`%${escapeLike(text.toLowerCase())}%`} escape ${sql.lit(ESCAPE)}`
}

/** `column` starts with `prefix`, exactly (case counts). */
export function startsWithLike(column: string, prefix: string): RawBuilder<boolean> {
  return sql<boolean>`${sql.ref(column)} like ${`${escapeLike(prefix)}%`} escape ${sql.lit(ESCAPE)}`
}
