// Synthetic load: an invented club's worth of observations, sketches, published entries, features and pins,
// written straight into a migrated SQLite file for the benchmarks.

import { randomUUID } from 'node:crypto'
import { join } from 'node:path'
import SQLite from 'better-sqlite3'
import { createDatabase } from '../../db/connect'
import { migrateToLatest } from '../../db/migrate'
import { nameKey, trigrams } from '../../shared/features/names'
import { PHASE_NAMES } from '../../shared/observing/phases'
import { inventedName, random } from './http'

export interface SyntheticSize {
  sketches: number
  publishedShare: number
  features: number
  pinsPerSketch: number
}

export interface SyntheticIds {
  featureIds: string[]
  featureNames: string[]
}

export async function buildSyntheticDb(dataDir: string, size: SyntheticSize): Promise<SyntheticIds> {
  const kysely = await createDatabase({ url: '', dataDir })
  await migrateToLatest(kysely)
  await kysely.destroy()
  const db = new SQLite(join(dataDir, 'shadowline.sqlite'))
  db.pragma('journal_mode = WAL')
  const rand = random(42)
  const at = '2026-12-01T00:00:00.000Z'
  const users = Array.from({ length: 200 }, (_, i) => ({ id: randomUUID(), name: `Synthetic observer ${i}` }))
  const featureIds: string[] = []
  const featureNames: string[] = []
  db.transaction(() => {
    const user = db.prepare(`insert into users (id, email, name, password_hash, role, email_verified_at, created_at, updated_at) values (?, ?, ?, 'x', 'observer', ?, ?, ?)`)
    const site = db.prepare(`insert into sites (id, user_id, name, latitude, longitude, elevation_m, time_zone, created_at, updated_at) values (?, ?, 'Synthetic field', ?, ?, 50, 'UTC', ?, ?)`)
    const siteIds = users.map((u, i) => {
      user.run(u.id, `synthetic${i}@example.test`, u.name, at, at, at)
      const id = randomUUID()
      site.run(id, u.id, 40 + rand() * 20, -10 + rand() * 20, at, at)
      return id
    })
    const feature = db.prepare(`insert into features (id, name, description, status, latitude, longitude, spread_deg, pin_count, created_at, updated_at) values (?, ?, '', ?, ?, ?, 0.3, 10, ?, ?)`)
    const name = db.prepare(`insert into feature_names (id, feature_id, name, name_key, kind, created_at) values (?, ?, ?, ?, ?, ?)`)
    const gram = db.prepare(`insert or ignore into feature_name_trigrams (trigram, name_id, name_key) values (?, ?, ?)`)
    const word = db.prepare(`insert or ignore into feature_name_words (word, name_id, name_key) values (?, ?, ?)`)
    const count = db.prepare(`insert into feature_trigram_counts (trigram, names) values (?, 1) on conflict (trigram) do update set names = names + 1`)
    for (let i = 0; i < size.features; i += 1) {
      const id = randomUUID()
      const label = inventedName(rand, i)
      feature.run(id, label, rand() < 0.7 ? 'confirmed' : 'proposed', -60 + rand() * 120, -80 + rand() * 160, at, at)
      const names: [string, string][] = [[label, 'name']]
      if (i % 2 === 0) names.push([inventedName(rand, i + 1_000_000), 'alias'])
      for (const [text, kind] of names) {
        const nameId = randomUUID()
        const key = nameKey(text)
        name.run(nameId, id, text, key, kind, at)
        for (const t of trigrams(key)) {
          gram.run(t, nameId, key)
          count.run(t)
        }
        for (const w of key.split(' ')) word.run(w, nameId, key)
      }
      featureIds.push(id)
      featureNames.push(label)
    }
    const observation = db.prepare(`insert into observations (id, user_id, site_id, observed_at, local_date, time_zone, instrument_kind, magnification, aperture_mm, view, notes, circumstances, computed_with, illuminated_fraction, age_days, phase_name, colongitude_deg, created_at, updated_at) values (?, ?, ?, ?, ?, 'UTC', ?, 10, 50, 'upright', '', '{}', 'synthetic', ?, ?, ?, ?, ?, ?)`)
    const sketch = db.prepare(`insert into sketches (id, observation_id, user_id, status, version, schema_version, shapes, view_orientation, view_flip, raster_key, thumb_small_key, thumb_large_key, created_at, updated_at) values (?, ?, ?, ?, 2, 1, '{}', 'zenith-up', 'none', 'x', 'x', 'x', ?, ?)`)
    const entry = db.prepare(`insert into atlas_entries (sketch_id, observer_id, observer_name, observed_at, age_days, phase_name, colongitude_deg, illuminated_fraction, instrument_kind, instrument_label, site_latitude, site_longitude, published_at) values (?, ?, ?, ?, ?, ?, ?, ?, ?, 'Binoculars 10 × 50', 51.5, -1.7, ?)`)
    const tag = db.prepare(`insert into feature_tags (id, sketch_id, feature_id, user_id, disk_x, disk_y, view_orientation, view_flip, latitude, longitude, created_at) values (?, ?, ?, ?, 0.1, 0.1, 'zenith-up', 'none', ?, ?, ?)`)
    const kinds = ['naked-eye', 'binoculars', 'telescope']
    for (let i = 0; i < size.sketches; i += 1) {
      const u = Math.floor(rand() * users.length)
      const observedAt = new Date(Date.UTC(2015, 0, 1) + rand() * 11 * 365.25 * 86_400_000).toISOString()
      const age = rand() * 29.53
      const phase = PHASE_NAMES[Math.floor(((age / 29.53) * 8 + 0.5) % 8)]!
      const colongitude = (((age / 29.53) * 360 + 270) % 360)
      const kind = kinds[i % 3]!
      const observationId = randomUUID()
      const sketchId = randomUUID()
      observation.run(observationId, users[u]!.id, siteIds[u], observedAt, observedAt.slice(0, 10), kind, 0.5, age, phase, colongitude, at, at)
      const published = rand() < size.publishedShare
      sketch.run(sketchId, observationId, users[u]!.id, published ? 'approved' : 'draft', at, at)
      if (published) entry.run(sketchId, users[u]!.id, users[u]!.name, observedAt, age, phase, colongitude, 0.5, kind, at)
      for (let p = 0; p < size.pinsPerSketch; p += 1) {
        tag.run(randomUUID(), sketchId, featureIds[Math.floor(rand() * featureIds.length)], users[u]!.id, rand() * 10, rand() * 10, at)
      }
    }
  })()
  db.pragma('optimize')
  db.exec('analyze')
  db.close()
  return { featureIds, featureNames }
}
