import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import { contains, type Formation } from '#shared/features/formations'
import { nameKey, similarity, trigrams } from '#shared/features/names'

type Db = Kysely<Database>

// The reference layer is a few hundred rows that change only by migration: read once per process and
// kept in memory, so suggestions, search and the terminator list cost no query.
let loaded: { db: Db, list: Promise<Formation[]> } | undefined

export function referenceFormations(db: Db): Promise<Formation[]> {
  if (loaded?.db !== db) {
    const list = db.selectFrom('formations').selectAll().orderBy('name').execute()
      .then(rows => rows.map(r => ({ id: r.id, name: r.name, kind: r.kind, latitude: r.latitude, longitude: r.longitude, diameterKm: r.diameter_km })))
    list.catch(() => {
      loaded = undefined
    })
    loaded = { db, list }
  }
  return loaded.list
}

export async function formationById(db: Db, id: string): Promise<Formation | undefined> {
  return (await referenceFormations(db)).find(f => f.id === id)
}

/** Records which formations' outlines hold a new pin. */
export async function pinFormations(db: Db, tag: { id: string, sketch_id: string, latitude: number, longitude: number }): Promise<void> {
  const inside = (await referenceFormations(db)).filter(f => contains(f, { lat: tag.latitude, lon: tag.longitude }))
  if (inside.length) {
    await db.insertInto('formation_pins').values(inside.map(f => ({ formation_id: f.id, sketch_id: tag.sketch_id, tag_id: tag.id }))).execute()
  }
}

export interface FormationMatch {
  id: string
  name: string
  kind: Formation['kind']
  latitude: number
  longitude: number
  diameterKm: number
  score: number
}

interface Indexed { formation: Formation, key: string, words: string[], grams: string[] }
let index: { list: Formation[], entries: Indexed[] } | undefined

/** The folded keys and trigrams of the reference names, worked out once. */
async function indexedFormations(db: Db): Promise<Indexed[]> {
  const list = await referenceFormations(db)
  if (index?.list !== list) {
    index = { list, entries: list.map((formation) => {
      const key = nameKey(formation.name)
      return { formation, key, words: key.split(' '), grams: trigrams(key) }
    }) }
  }
  return index.entries
}

/**
 * Name search over the reference names, scored like the gazetteer's: word prefixes first; trigram likeness
 * only when the prefixes find next to nothing (a slip of a letter).
 */
export async function searchFormations(db: Db, query: string, limit = 8): Promise<FormationMatch[]> {
  const key = nameKey(query)
  const words = key.split(' ').filter(Boolean)
  if (!words.length) return []
  const entries = await indexedFormations(db)
  const out: FormationMatch[] = []
  for (const f of entries) {
    if (words.every(q => f.words.some(w => w.startsWith(q)))) out.push({ ...f.formation, score: 2 + (f.key.startsWith(key) ? 1 : 0) })
  }
  if (out.length < 3) {
    const grams = trigrams(key)
    const gramSet = new Set(grams)
    for (const f of entries) {
      if (out.some(o => o.id === f.formation.id)) continue
      const score = similarity(grams, f.grams, f.grams.filter(g => gramSet.has(g)).length)
      if (score >= 0.3) out.push({ ...f.formation, score })
    }
  }
  return out.sort((a, b) => b.score - a.score || a.name.localeCompare(b.name)).slice(0, limit)
}

/**
 * The feature a pin takes when the observer picks a standard name: the feature linked to the formation,
 * else one already answering to the same name (linked now: the name is the formation's own), else a new
 * confirmed feature under the IAU name, proposed by no one, since the name is the standard's and not a user's.
 */
export async function featureForFormation(db: Db, formation: Formation): Promise<string> {
  const linked = await db.selectFrom('features').select('id')
    .where('formation_id', '=', formation.id).where('merged_into', 'is', null)
    .orderBy('created_at').executeTakeFirst()
  if (linked) return linked.id
  const named = await featureNamed(db, formation.name)
  if (named) {
    if (!named.formation_id) await db.updateTable('features').set({ formation_id: formation.id }).where('id', '=', named.id).execute()
    return named.id
  }
  const id = randomUUID()
  const at = new Date().toISOString()
  await db.insertInto('features').values({
    id,
    name: formation.name,
    description: '',
    status: 'confirmed',
    proposed_by: null,
    merged_into: null,
    latitude: null,
    longitude: null,
    spread_deg: null,
    formation_id: formation.id,
    created_at: at,
    updated_at: at,
  }).execute()
  await addName(db, id, formation.name, 'name')
  return id
}
