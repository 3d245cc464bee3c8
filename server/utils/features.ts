import { randomUUID } from 'node:crypto'
import { createError } from 'h3'
import type { Kysely } from 'kysely'
import type { Database, Feature } from '../../db/schema'
import { nameKey, similarity, trigrams } from '#shared/features/names'
import { distanceFromTerminator, meanPosition } from '#shared/features/position'

type Db = Kysely<Database>

/** Adds a name (or alias) and its trigrams. */
export async function addName(db: Db, featureId: string, name: string, kind: 'name' | 'alias'): Promise<void> {
  const id = randomUUID()
  const key = nameKey(name)
  await db.insertInto('feature_names').values({ id, feature_id: featureId, name: name.trim(), name_key: key, kind, created_at: new Date().toISOString() }).execute()
  const grams = trigrams(key)
  if (grams.length) await db.insertInto('feature_name_trigrams').values(grams.map(trigram => ({ trigram, name_id: id }))).execute()
}

/** The live feature that already answers to this name, if any. */
export async function featureNamed(db: Db, name: string): Promise<Feature | undefined> {
  return db.selectFrom('feature_names')
    .innerJoin('features', 'features.id', 'feature_names.feature_id')
    .selectAll('features')
    .where('feature_names.name_key', '=', nameKey(name))
    .where('features.merged_into', 'is', null)
    .executeTakeFirst()
}

export async function createFeature(db: Db, input: { name: string, description: string, proposedBy: string | null }): Promise<string> {
  const existing = await featureNamed(db, input.name)
  if (existing) {
    throw createError({ status: 409, message: `“${existing.name}” already has that name; pick it instead.`, data: { featureId: existing.id } })
  }
  const id = randomUUID()
  const at = new Date().toISOString()
  await db.insertInto('features').values({
    id,
    name: input.name.trim(),
    description: input.description.trim(),
    proposed_by: input.proposedBy,
    merged_into: null,
    latitude: null,
    longitude: null,
    spread_deg: null,
    created_at: at,
    updated_at: at,
  }).execute()
  await addName(db, id, input.name, 'name')
  return id
}

export interface FeatureMatch {
  id: string
  name: string
  /** The alias that matched, when it was not the feature's own name. */
  matched: string | null
  status: 'proposed' | 'confirmed'
  latitude: number | null
  longitude: number | null
  pinCount: number
  score: number
}

/**
 * Forgiving name search: candidates share trigrams with the folded query (so case, accents and a slip of
 * a letter do not matter), ranked by Jaccard similarity with a lift for names that start with the query.
 */
export async function searchFeatures(db: Db, query: string, limit = 20, status?: 'proposed' | 'confirmed'): Promise<FeatureMatch[]> {
  const key = nameKey(query)
  const grams = trigrams(key)
  if (!grams.length) return []
  let candidates = db.selectFrom('feature_name_trigrams')
    .innerJoin('feature_names', 'feature_names.id', 'feature_name_trigrams.name_id')
    .innerJoin('features', 'features.id', 'feature_names.feature_id')
    .select(eb => [
      'feature_names.name as matchedName', 'feature_names.name_key', 'feature_names.kind',
      'features.id', 'features.name', 'features.status', 'features.latitude', 'features.longitude', 'features.pin_count',
      eb.fn.countAll<number>().as('shared'),
    ])
    .where('feature_name_trigrams.trigram', 'in', grams)
    .where('features.merged_into', 'is', null)
  if (status) candidates = candidates.where('features.status', '=', status)
  const rows = await candidates
    .groupBy(['feature_names.id', 'feature_names.name', 'feature_names.name_key', 'feature_names.kind', 'features.id', 'features.name', 'features.status', 'features.latitude', 'features.longitude', 'features.pin_count'])
    .orderBy('shared', 'desc')
    .limit(200)
    .execute()
  const best = new Map<string, FeatureMatch>()
  for (const row of rows) {
    let score = similarity(grams, trigrams(row.name_key), Number(row.shared))
    if (row.name_key.startsWith(key)) score += 1
    else if (row.name_key.includes(key)) score += 0.5
    if (score < 0.3) continue
    const found = best.get(row.id)
    if (!found || found.score < score) {
      best.set(row.id, {
        id: row.id,
        name: row.name,
        matched: row.kind === 'alias' ? row.matchedName : null,
        status: row.status,
        latitude: row.latitude,
        longitude: row.longitude,
        pinCount: row.pin_count,
        score,
      })
    }
  }
  return [...best.values()].sort((a, b) => b.score - a.score || a.name.localeCompare(b.name)).slice(0, limit)
}

/** The feature's place is the mean of its pins, kept on the row so the map and lists need no aggregate. */
export async function recomputePosition(db: Db, featureId: string): Promise<void> {
  const pins = await db.selectFrom('feature_tags').select(['latitude', 'longitude']).where('feature_id', '=', featureId).execute()
  const mean = meanPosition(pins.map(p => ({ lat: p.latitude, lon: p.longitude })))
  await db.updateTable('features').set({
    latitude: mean?.lat ?? null,
    longitude: mean?.lon ?? null,
    spread_deg: mean?.spreadDeg ?? null,
    pin_count: pins.length,
    updated_at: new Date().toISOString(),
  }).where('id', '=', featureId).execute()
}

/**
 * Folds a duplicate into another feature: its names become aliases, its pins follow, and the duplicate
 * stays with a pointer to where it went, so nothing is lost.
 */
export async function mergeFeatures(db: Db, fromId: string, intoId: string): Promise<void> {
  if (fromId === intoId) throw createError({ status: 400, message: 'into: A feature cannot be merged into itself.' })
  await db.transaction().execute(async (trx) => {
    const live = await trx.selectFrom('features').select(['id']).where('id', 'in', [fromId, intoId]).where('merged_into', 'is', null).execute()
    if (live.length !== 2) throw createError({ status: 404, message: 'Both features must exist and not be merged already.' })
    await trx.updateTable('feature_names').set({ feature_id: intoId, kind: 'alias' }).where('feature_id', '=', fromId).execute()
    await trx.updateTable('feature_tags').set({ feature_id: intoId }).where('feature_id', '=', fromId).execute()
    await trx.updateTable('features').set({ merged_into: intoId }).where('merged_into', '=', fromId).execute()
    await trx.updateTable('features').set({ merged_into: intoId, pin_count: 0, updated_at: new Date().toISOString() }).where('id', '=', fromId).execute()
    await recomputePosition(trx, intoId)
  })
}

/** A new primary name; the old one stays as an alias so earlier searches still find it. */
export async function renameFeature(db: Db, id: string, name: string): Promise<void> {
  const clash = await featureNamed(db, name)
  if (clash && clash.id !== id) throw createError({ status: 409, message: `“${clash.name}” already has that name; merge the two instead.` })
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('feature_names').set({ kind: 'alias' }).where('feature_id', '=', id).where('kind', '=', 'name').execute()
    const same = await trx.selectFrom('feature_names').select('id').where('feature_id', '=', id).where('name_key', '=', nameKey(name)).executeTakeFirst()
    if (same) await trx.updateTable('feature_names').set({ kind: 'name', name: name.trim() }).where('id', '=', same.id).execute()
    else await addName(trx, id, name, 'name')
    await trx.updateTable('features').set({ name: name.trim(), updated_at: new Date().toISOString() }).where('id', '=', id).execute()
  })
}

export async function featureAliases(db: Db, id: string): Promise<string[]> {
  const rows = await db.selectFrom('feature_names').select('name').where('feature_id', '=', id).where('kind', '=', 'alias').orderBy('name').execute()
  return rows.map(r => r.name)
}

/** Confirmed features within `within`° of the terminator, nearest first. */
export async function confirmedNearTerminator(colongitudeDeg: number, subSolarLatDeg: number, within = 10) {
  const rows = await useDb().selectFrom('features')
    .select(['id', 'name', 'latitude', 'longitude'])
    .where('status', '=', 'confirmed')
    .where('merged_into', 'is', null)
    .where('latitude', 'is not', null)
    .execute()
  return rows
    .map(f => ({ id: f.id, name: f.name, latitude: f.latitude!, longitude: f.longitude!, distanceDeg: distanceFromTerminator({ lat: f.latitude!, lon: f.longitude! }, colongitudeDeg, subSolarLatDeg) }))
    .filter(f => f.distanceDeg <= within)
    .sort((a, b) => a.distanceDeg - b.distanceDeg)
}
