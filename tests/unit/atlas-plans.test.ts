// The atlas filters read through indexes, never a scan of every published entry (SQLite's EXPLAIN QUERY
// PLAN on the queries the route runs).

import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createDatabase } from '../../db/connect'
import { migrateToLatest } from '../../db/migrate'
import type { Database } from '../../db/schema'
import { atlasPage } from '../../server/utils/atlas'
import { AtlasQuery } from '../../shared/schemas/review'

let db: Kysely<Database>

beforeAll(async () => {
  db = await createDatabase({ url: ':memory:', dataDir: '/tmp' })
  await migrateToLatest(db)
})
afterAll(async () => {
  await db?.destroy()
})

async function plan(query: Record<string, unknown>): Promise<string> {
  const compiled = atlasPage(db, AtlasQuery.parse(query)).compile()
  const rows = await db.executeQuery<{ detail: string }>({ ...compiled, sql: `explain query plan ${compiled.sql}` })
  return rows.rows.map(r => r.detail).join('\n')
}

describe('atlas query plans', () => {
  it('a phase filter walks the phase index in date order', async () => {
    const p = await plan({ phase: 'waxing-crescent' })
    expect(p).toMatch(/atlas_entries USING INDEX atlas_phase_idx/)
    expect(p).not.toMatch(/SCAN atlas_entries(?! USING)/)
  })

  it('a colongitude range reads the colongitude index, also when it wraps through 0°', async () => {
    expect(await plan({ colongitudeMin: 20, colongitudeMax: 30 })).toMatch(/atlas_colongitude_idx \(colongitude_deg>\? AND colongitude_deg<\?\)/)
    const wrapped = await plan({ colongitudeMin: 350, colongitudeMax: 10 })
    expect(wrapped).toMatch(/atlas_colongitude_idx/)
    expect(wrapped).not.toMatch(/SCAN atlas_entries(?! USING)/)
  })

  it('a feature filter starts from the feature\'s pins and looks entries up by key', async () => {
    const p = await plan({ feature: '6b1c9a64-2f57-4f55-9a3e-000000000001' })
    expect(p).toMatch(/feature_tags USING COVERING INDEX feature_tags_feature_idx \(feature_id=\?\)/)
    expect(p).toMatch(/atlas_entries USING INDEX sqlite_autoindex_atlas_entries_1 \(sketch_id=\?\)/)
  })
})
