import { randomUUID } from 'node:crypto'
import { createError } from 'h3'
import type { Kysely } from 'kysely'
import type { Database, Feature } from '../../db/schema'
import { nameKey, similarity, trigrams } from '#shared/features/names'
import { distanceFromTerminator, meanPosition } from '#shared/features/position'
import { featureIsVisible } from './privacy'

type Db = Kysely<Database>

/** Adds a name (or alias) and its trigrams. */
export async function addName(db: Db, featureId: string, name: string, kind: 'name' | 'alias'): Promise<void> {
  const id = randomUUID()
  const key = nameKey(name)
  await db.insertInto('feature_names').values({ id, feature_id: featureId, name: name.trim(), name_key: key, kind, created_at: new Date().toISOString() }).execute()
  const grams = trigrams(key)
  if (grams.length) {
    await db.insertInto('feature_name_trigrams').values(grams.map(trigram => ({ trigram, name_id: id }))).execute()
    await db.insertInto('feature_trigram_counts').values(grams.map(trigram => ({ trigram, names: 1 })))
      .onConflict(oc => oc.column('trigram').doUpdateSet(eb => ({ names: eb('feature_trigram_counts.names', '+', 1) })))
      .execute()
  }
  const words = [...new Set(key.split(' ').filter(Boolean))]
  if (words.length) await db.insertInto('feature_name_words').values(words.map(word => ({ word, name_id: id }))).execute()
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

const PREFIX_CANDIDATES = 50
const FUZZY_CANDIDATES = 200
const FUZZY_BELOW = 5

function namesQuery(db: Db) {
  return db.selectFrom('feature_names')
    .innerJoin('features', 'features.id', 'feature_names.feature_id')
    .select(['feature_names.id as nameId', 'feature_names.name as matchedName', 'feature_names.name_key', 'feature_names.kind',
      'features.id', 'features.name', 'features.status', 'features.latitude', 'features.longitude', 'features.pin_count'])
    .where('features.merged_into', 'is', null)
}

/** The first string after every string that starts with `prefix`: the bound of an index range scan. */
export function prefixEnd(prefix: string): string {
  return prefix.slice(0, -1) + String.fromCodePoint(prefix.codePointAt(prefix.length - 1)! + 1)
}

/** Scores a name against the query: every query word a word prefix, else trigram likeness. */
function scoreName(queryWords: string[], queryGrams: string[], nameKeyText: string): number {
  const words = nameKeyText.split(' ')
  const prefixes = queryWords.filter(q => words.some(w => w.startsWith(q))).length
  if (prefixes === queryWords.length) return 2 + (nameKeyText.startsWith(queryWords.join(' ')) ? 1 : 0) - nameKeyText.length / 1000
  const grams = trigrams(nameKeyText)
  const shared = queryGrams.filter(g => grams.includes(g)).length
  return similarity(queryGrams, grams, shared)
}

/**
 * Forgiving name search. First the fast path, an index range scan for names with a word that starts
 * with the most telling query word (search as you type); when that finds too little, candidates sharing
 * the query's rarest trigrams, ranked by Jaccard likeness, so a slip of a letter still finds the name.
 * Case and accents never matter: everything is matched on folded keys.
 */
export async function searchFeatures(db: Db, query: string, limit = 20, status?: 'proposed' | 'confirmed', viewerId: string | null = null): Promise<FeatureMatch[]> {
  const key = nameKey(query)
  const queryWords = key.split(' ').filter(Boolean)
  if (!queryWords.length) return []
  const queryGrams = trigrams(key)
  // The longest word narrows the scan most; of equal ones, the last, which is the one being typed.
  const longest = [...queryWords].reverse().sort((a, b) => b.length - a.length)[0]!

  const names = (narrow: (q: ReturnType<typeof namesQuery>) => ReturnType<typeof namesQuery>) => {
    let q = narrow(namesQuery(db)).where(featureIsVisible(viewerId))
    if (status) q = q.where('features.status', '=', status)
    return q.execute()
  }
  const prefixRows = await names(q => q
    .innerJoin('feature_name_words', 'feature_name_words.name_id', 'feature_names.id')
    .where('feature_name_words.word', '>=', longest)
    .where('feature_name_words.word', '<', prefixEnd(longest))
    .limit(PREFIX_CANDIDATES))
  // Word-prefix matches score 1.9 and up; trigram likeness is at most 1.
  let results = prefixRows.map(row => ({ row, score: scoreName(queryWords, queryGrams, row.name_key) })).filter(r => r.score >= 0.3)
  const strong = results.filter(r => r.score > 1.5).length

  // Likeness only when the prefixes find next to nothing: a slip of a letter, not a short prefix.
  if (strong < Math.min(limit, FUZZY_BELOW) && queryGrams.length) {
    // The rarest trigrams carry the most information and have the shortest lists to read.
    const rarest = (await db.selectFrom('feature_trigram_counts')
      .select('trigram')
      .where('trigram', 'in', queryGrams)
      .orderBy('names')
      .limit(2)
      .execute()).map(c => c.trigram)
    if (rarest.length) {
      const seen = new Set(prefixRows.map(r => r.nameId))
      const fuzzyRows = await names(q => q
        .innerJoin('feature_name_trigrams', 'feature_name_trigrams.name_id', 'feature_names.id')
        .where('feature_name_trigrams.trigram', 'in', rarest)
        .limit(FUZZY_CANDIDATES))
      results = results.concat(fuzzyRows
        .filter(row => !seen.has(row.nameId))
        .map(row => ({ row, score: scoreName(queryWords, queryGrams, row.name_key) }))
        .filter(r => r.score >= 0.3))
    }
  }

  const best = new Map<string, FeatureMatch>()
  for (const { row, score } of results) {
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

export interface PlacedFeature {
  id: string
  name: string
  latitude: number
  longitude: number
}

/** Every confirmed, live feature that has a place on the Moon. */
export async function confirmedFeatures(db: Db): Promise<PlacedFeature[]> {
  const rows = await db.selectFrom('features')
    .select(['id', 'name', 'latitude', 'longitude'])
    .where('status', '=', 'confirmed')
    .where('merged_into', 'is', null)
    .where('latitude', 'is not', null)
    .execute()
  return rows.map(f => ({ id: f.id, name: f.name, latitude: f.latitude!, longitude: f.longitude! }))
}

/** Those within `within`° of the terminator at a colongitude, nearest first. */
export function nearTerminator(features: PlacedFeature[], colongitudeDeg: number, subSolarLatDeg: number, within = 10) {
  return features
    .map(f => ({ ...f, distanceDeg: distanceFromTerminator({ lat: f.latitude, lon: f.longitude }, colongitudeDeg, subSolarLatDeg) }))
    .filter(f => f.distanceDeg <= within)
    .sort((a, b) => a.distanceDeg - b.distanceDeg)
}
