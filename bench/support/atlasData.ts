// Synthetic published atlas for the atlas benchmark and the query-plan test, written by the database itself
// (a row series and integer hashes) so a million entries load in a minute rather than an hour of round trips:
// invented observers and features, observations, approved sketches, their atlas entries and pins.

import SQLite from 'better-sqlite3'
import { Kysely, SqliteDialect, sql, type RawBuilder } from 'kysely'
import type { Database } from '../../db/schema'
import { PHASE_NAMES } from '../../shared/observing/phases'

export interface AtlasDataSize {
  entries: number
  features: number
  pinsPerEntry: number
}

export const OBSERVERS = 200

type Dialect = 'sqlite' | 'postgres'

/** A UUID-shaped id from a kind (1 to 9) and a number, the same in both dialects. */
export function syntheticId(kind: number, n: number): string {
  return `0000000${kind}-0000-4000-8000-${n.toString(16).padStart(12, '0')}`
}

function helpers(dialect: Dialect) {
  const id = (kind: number, n: string) => dialect === 'sqlite'
    ? `printf('0000000${kind}-0000-4000-8000-%012x', ${n})`
    : `'0000000${kind}-0000-4000-8000-' || lpad(to_hex(${n}), 12, '0')`
  const series = (n: number) => dialect === 'sqlite'
    ? `(with recursive s(i) as (select 1 union all select i + 1 from s where i < ${n}) select i from s) n`
    : `generate_series(1::bigint, ${n}) as n(i)`
  const instant = (seconds: string) => dialect === 'sqlite'
    ? `strftime('%Y-%m-%dT%H:%M:%fZ', ${seconds}, 'unixepoch')`
    : `to_char(to_timestamp(${seconds}) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`
  return { id, series, instant }
}

/**
 * A SQLite file opened for loading alone: out of write-ahead mode (which the app's own connection turns on,
 * and which would log gigabytes for a million rows), so the rows go straight into the file.
 */
export function sqliteForLoading(file: string): Kysely<Database> {
  const database = new SQLite(file)
  database.pragma('journal_mode = off')
  return new Kysely<Database>({ dialect: new SqliteDialect({ database }) })
}

/** Fills a migrated, empty database; returns the feature ids. */
export async function fillAtlas(db: Kysely<Database>, dialect: Dialect, size: AtlasDataSize): Promise<string[]> {
  const { id, series, instant } = helpers(dialect)
  const at = `'2026-12-01T00:00:00.000Z'`
  // Integer hashes of the row number stand in for random values: spread, repeatable, computed in SQL.
  const ageMilli = `((n.i * 2654435761) % 1000003) % 29530`
  const phase = `case ((${ageMilli}) * 8 + 14765) / 29530 % 8 ${PHASE_NAMES.map((p, k) => `when ${k} then '${p}'`).join(' ')} end`
  const colongitude = `((${ageMilli}) * 360.0 / 29530 + 270 - case when (${ageMilli}) * 360.0 / 29530 + 270 >= 360 then 360 else 0 end)`
  const observedAt = instant(`1420070400 + ((n.i * 7919) % 1000003) * 347 + n.i % 347`)
  const kind = `case n.i % 3 when 0 then 'naked-eye' when 1 then 'binoculars' else 'telescope' end`
  const statements = [
    `insert into users (id, email, name, password_hash, role, email_verified_at, created_at, updated_at)
      select ${id(1, 'n.i')}, 'synthetic' || n.i || '@example.test', 'Synthetic observer ' || n.i, 'x', 'observer', ${at}, ${at}, ${at} from ${series(OBSERVERS)}`,
    `insert into sites (id, user_id, name, latitude, longitude, elevation_m, time_zone, created_at, updated_at)
      select ${id(2, 'n.i')}, ${id(1, 'n.i')}, 'Synthetic field', 40 + n.i % 20, -10 + n.i % 20, 50, 'UTC', ${at}, ${at} from ${series(OBSERVERS)}`,
    `insert into features (id, name, description, status, latitude, longitude, spread_deg, pin_count, created_at, updated_at)
      select ${id(3, 'n.i')}, 'Synthetic feature ' || n.i, '', 'confirmed', -60 + n.i % 120, -80 + n.i % 160, 0.3, ${size.pinsPerEntry * Math.ceil(size.entries / size.features)}, ${at}, ${at} from ${series(size.features)}`,
    `insert into observations (id, user_id, site_id, observed_at, local_date, time_zone, instrument_kind, magnification, aperture_mm, view, notes, circumstances, computed_with, illuminated_fraction, age_days, phase_name, colongitude_deg, created_at, updated_at)
      select ${id(4, 'n.i')}, ${id(1, `(n.i % ${OBSERVERS} + 1)`)}, ${id(2, `(n.i % ${OBSERVERS} + 1)`)}, ${observedAt}, substr(${observedAt}, 1, 10), 'UTC', ${kind}, 10, 50, 'upright', '', '{}', 'synthetic', 0.5, (${ageMilli}) / 1000.0, ${phase}, ${colongitude}, ${at}, ${at} from ${series(size.entries)}`,
    `insert into sketches (id, observation_id, user_id, status, version, schema_version, shapes, view_orientation, view_flip, raster_key, thumb_small_key, thumb_large_key, created_at, updated_at)
      select ${id(5, 'n.i')}, ${id(4, 'n.i')}, ${id(1, `(n.i % ${OBSERVERS} + 1)`)}, 'approved', 2, 1, '{}', 'zenith-up', 'none', 'x', 'x', 'x', ${at}, ${at} from ${series(size.entries)}`,
    `insert into atlas_entries (sketch_id, observer_id, observer_name, observed_at, age_days, phase_name, colongitude_deg, illuminated_fraction, instrument_kind, instrument_label, site_latitude, site_longitude, published_at)
      select ${id(5, 'n.i')}, ${id(1, `(n.i % ${OBSERVERS} + 1)`)}, 'Synthetic observer ' || (n.i % ${OBSERVERS} + 1), ${observedAt}, (${ageMilli}) / 1000.0, ${phase}, ${colongitude}, 0.5, ${kind}, 'Binoculars 10 × 50', 51.5, -1.7, ${at} from ${series(size.entries)}`,
    `insert into feature_tags (id, sketch_id, feature_id, user_id, disk_x, disk_y, view_orientation, view_flip, latitude, longitude, created_at)
      select ${id(6, 'n.i')}, ${id(5, `((n.i - 1) / ${size.pinsPerEntry} + 1)`)}, ${id(3, `((n.i * 48271) % 1000003 % ${size.features} + 1)`)}, ${id(1, `(((n.i - 1) / ${size.pinsPerEntry} + 1) % ${OBSERVERS} + 1)`)}, 0.1, 0.1, 'zenith-up', 'none', 0, 0, ${at} from ${series(size.entries * size.pinsPerEntry)}`,
    `insert into atlas_feature_entries (feature_id, entry_id, entry_observed_at, entry_colongitude_deg)
      select t.feature_id, a.sketch_id, a.observed_at, a.colongitude_deg from feature_tags t cross join atlas_entries a where a.sketch_id = t.sketch_id
      on conflict do nothing`,
  ]
  const raw = (text: string) => sql.raw(text) as RawBuilder<unknown>
  await db.connection().execute(async (connection) => {
    // Loading, not serving: the rows reference each other by construction, so foreign keys are not
    // checked row by row while they go in.
    await raw(dialect === 'postgres' ? 'set session_replication_role = replica' : 'pragma foreign_keys = off').execute(connection)
    // Indexes are built once at the end from sorted data, far faster than kept up row by row.
    const tables = `'observations', 'sketches', 'atlas_entries', 'feature_tags', 'atlas_feature_entries'`
    const indexes = (await raw(dialect === 'postgres'
      ? `select indexname as name, indexdef as definition from pg_indexes where tablename in (${tables}) and indexdef like 'CREATE INDEX%'`
      : `select name, sql as definition from sqlite_master where type = 'index' and sql is not null and tbl_name in (${tables})`,
    ).execute(connection)).rows as { name: string, definition: string }[]
    if (dialect === 'sqlite') {
      // One large transaction straight into the file: no write-ahead log of gigabytes, no syncs.
      for (const pragma of ['journal_mode = off', 'synchronous = off', 'cache_size = -1000000']) await raw(`pragma ${pragma}`).execute(connection)
    }
    await connection.transaction().execute(async (trx) => {
      for (const index of indexes) await raw(`drop index ${index.name}`).execute(trx)
      for (const text of statements) {
        const started = Date.now()
        await raw(text).execute(trx)
        if (process.env.ATLAS_DATA_TIMING) console.log(`    ${text.slice(0, 30)}… ${Date.now() - started} ms`)
      }
      for (const index of indexes) await raw(index.definition).execute(trx)
    })
    if (dialect === 'sqlite') {
      for (const pragma of ['journal_mode = wal', 'synchronous = normal', 'cache_size = -65536']) await raw(`pragma ${pragma}`).execute(connection)
    }
    await raw(dialect === 'postgres' ? 'set session_replication_role = origin' : 'pragma foreign_keys = on').execute(connection)
    // Statistics for the planner (on SQLite from a sample of each index, as `pragma optimize` gathers them).
    if (dialect === 'sqlite') await raw('pragma analysis_limit = 1000').execute(connection)
    await raw(dialect === 'postgres' ? 'vacuum analyze' : 'analyze').execute(connection)
  })
  return Array.from({ length: size.features }, (_, k) => syntheticId(3, k + 1))
}
