import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Kysely, SelectQueryBuilder } from 'kysely'
import type { AtlasEntry, Database } from '../../db/schema'
import type { AtlasQuery } from '#shared/schemas/review'

/** The columns a card shows; the covering indexes of the atlas hold each of them (see the migration). */
export const CARD_COLUMNS = [
  'sketch_id', 'observer_id', 'observer_name', 'observed_at', 'age_days', 'phase_name', 'colongitude_deg',
  'illuminated_fraction', 'instrument_kind', 'instrument_label', 'site_latitude', 'site_longitude', 'published_at', 'group_id', 'group_name',
] as const satisfies readonly (keyof AtlasEntry)[]

export type AtlasCardRow = Pick<AtlasEntry, typeof CARD_COLUMNS[number]>

/** The public face of an entry: never an e-mail address, never a precise coordinate. */
export function atlasCard(row: AtlasCardRow) {
  return {
    id: row.sketch_id,
    observer: { id: row.observer_id, name: row.observer_name },
    observedAt: row.observed_at,
    ageDays: row.age_days,
    phaseName: row.phase_name,
    colongitudeDeg: row.colongitude_deg,
    illuminatedFraction: row.illuminated_fraction,
    instrumentKind: row.instrument_kind,
    instrumentLabel: row.instrument_label,
    site: { latitude: row.site_latitude, longitude: row.site_longitude },
    publishedAt: row.published_at,
    group: row.group_id && row.group_name ? { id: row.group_id, name: row.group_name } : null,
  }
}

export type AtlasCard = ReturnType<typeof atlasCard>

type Entries = SelectQueryBuilder<Database, 'atlas_entries', object>

/**
 * The filters of the atlas, every one but the lighting range (which `atlasPage` walks itself, see
 * `lightingRanges`). A new filter is one more `where` here; it keeps the listing order and the keyset
 * pages. Each clause compares a stored column with a value: nothing is computed per row.
 */
export function atlasQuery(db: Kysely<Database>, q: Omit<AtlasQuery, 'perPage'>): Entries {
  let query = db.selectFrom('atlas_entries')
  if (q.phase) query = query.where('phase_name', '=', q.phase)
  if (q.ageMin !== undefined) query = query.where('age_days', '>=', q.ageMin)
  if (q.ageMax !== undefined) query = query.where('age_days', '<=', q.ageMax)
  if (q.observer) query = query.where('observer_id', '=', q.observer)
  if (q.feature) {
    const feature = q.feature
    // Driven from the feature's pins (index on feature_id, sketch_id), not by probing every entry.
    query = query.where('sketch_id', 'in', eb => eb.selectFrom('feature_tags')
      .select('feature_tags.sketch_id')
      .where('feature_tags.feature_id', '=', feature))
  }
  if (q.formation) {
    const formation = q.formation
    // Driven from the pins inside the formation (primary key formation_id, sketch_id).
    query = query.where('sketch_id', 'in', eb => eb.selectFrom('formation_pins')
      .select('formation_pins.sketch_id')
      .where('formation_pins.formation_id', '=', formation))
  }
  // Only a listed group has a name in the atlas, so only a listed group can be filtered by.
  if (q.group) query = query.where('group_id', '=', q.group).where('group_name', 'is not', null)
  if (q.instrument) query = query.where('instrument_kind', '=', q.instrument)
  if (q.from) query = query.where('observed_at', '>=', `${q.from}T00:00:00.000Z`)
  if (q.to) query = query.where('observed_at', '<=', `${q.to}T23:59:59.999Z`)
  return query
}

type OrderKey = 'observed_at' | 'colongitude_deg' | 'age_days'
interface Order { key: OrderKey, dir: 'asc' | 'desc' }

/**
 * A lighting filter lists by colongitude and an age filter by age (each the order of its index, and the
 * order that matters when comparing light); otherwise the newest observations come first. The entry id
 * breaks ties, so every card has one place in the listing and a page can start right after a card.
 */
export function atlasOrder(q: Pick<AtlasQuery, 'colongitudeMin' | 'colongitudeMax' | 'ageMin' | 'ageMax'>): Order {
  if (q.colongitudeMin !== undefined || q.colongitudeMax !== undefined) return { key: 'colongitude_deg', dir: 'asc' }
  if (q.ageMin !== undefined || q.ageMax !== undefined) return { key: 'age_days', dir: 'asc' }
  return { key: 'observed_at', dir: 'desc' }
}

/**
 * The colongitude ranges to walk, in listing order. The terminator's position wraps at 360°: 350 to 10 is
 * the stretch from 350° up to 360° and then from 0° to 10°, two index ranges read one after the other
 * rather than one OR that the database would have to sort.
 */
export function lightingRanges(q: Pick<AtlasQuery, 'colongitudeMin' | 'colongitudeMax'>): ([number, number] | null)[] {
  const { colongitudeMin: lo, colongitudeMax: hi } = q
  if (lo === undefined && hi === undefined) return [null]
  if (lo !== undefined && hi !== undefined && lo > hi) return [[lo, 360], [0, hi]]
  return [[lo ?? 0, hi ?? 360]]
}

interface Cursor { value: string | number, id: string }

const INSTANT = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,6})?Z$/

/** A page link names the card it continues from: `sort value~id`, readable and shareable. */
export function cursorOf(row: AtlasCardRow, order: Order): string {
  return `${row[order.key]}~${row.sketch_id}`
}

function parseCursor(text: string, order: Order): Cursor {
  const [value = '', id = ''] = text.split('~')
  if (order.key === 'observed_at') {
    if (INSTANT.test(value)) return { value, id }
  }
  else if (value !== '' && Number.isFinite(Number(value))) {
    return { value: Number(value), id }
  }
  throw createError({ status: 400, message: 'This page link does not fit these filters: start from the first page.' })
}

/** One index range of the listing, forwards or (for the page before a card) backwards. */
function rangeQuery(db: Kysely<Database>, q: AtlasQuery, order: Order, range: [number, number] | null, cursor: Cursor | undefined, back: boolean, limit: number) {
  const dir = back ? (order.dir === 'asc' ? 'desc' : 'asc') : order.dir
  const keyed = (query: Entries) => {
    let out = query
    if (range) out = out.where('colongitude_deg', '>=', range[0]).where('colongitude_deg', '<=', range[1])
    if (cursor) {
      // A row-value comparison is a single bound on the index (SQLite 3.15+, PostgreSQL).
      out = out.where(eb => eb(eb.refTuple(order.key, 'sketch_id'), dir === 'asc' ? '>' : '<', eb.tuple(cursor.value, cursor.id)))
    }
    return out.orderBy(order.key, dir).orderBy('sketch_id', dir).limit(limit)
  }
  const cards = db.selectFrom('atlas_entries').select(CARD_COLUMNS).orderBy(order.key, dir).orderBy('sketch_id', dir)
  if (!q.feature) return keyed(atlasQuery(db, q)).select(CARD_COLUMNS)
  if (!featureAlone(q)) {
    // A feature with other filters: its entries come from its pins (as many as the feature has), and
    // only the page's cards are read in full.
    return cards.where('sketch_id', 'in', keyed(atlasQuery(db, q)).select('sketch_id'))
  }
  // A feature alone (the atlas filter, the feature's page): one range of the feature's published entries
  // in listing order, then the page's cards.
  if (order.key === 'age_days') throw new Error('a feature listing is by date or by lighting')
  const key = order.key === 'observed_at' ? 'entry_observed_at' : 'entry_colongitude_deg'
  let ids = db.selectFrom('atlas_feature_entries').select('entry_id').where('feature_id', '=', q.feature)
  if (range) ids = ids.where('entry_colongitude_deg', '>=', range[0]).where('entry_colongitude_deg', '<=', range[1])
  if (cursor) ids = ids.where(eb => eb(eb.refTuple(key, 'entry_id'), dir === 'asc' ? '>' : '<', eb.tuple(cursor.value, cursor.id)))
  return cards.where('sketch_id', 'in', ids.orderBy(key, dir).orderBy('entry_id', dir).limit(limit))
}

// The keys a feature's own listing answers by itself; any other filter goes through the general query.
const FEATURE_LISTING_KEYS = new Set(['feature', 'colongitudeMin', 'colongitudeMax', 'after', 'before', 'perPage'])

function featureAlone(q: AtlasQuery): boolean {
  return Object.entries(q).every(([k, v]) => v === undefined || FEATURE_LISTING_KEYS.has(k))
}

/**
 * Brings a feature's listing up to date with its pins on published entries: for one entry (published,
 * withdrawn, pinned or unpinned) or for one feature (after a merge). Withdrawal also removes the rows by
 * cascade; calling it then is harmless.
 */
export async function refreshFeatureEntries(db: Kysely<Database>, of: { entryId: string } | { featureId: string }): Promise<void> {
  const entryId = 'entryId' in of ? of.entryId : undefined
  const featureId = 'featureId' in of ? of.featureId : undefined
  let gone = db.deleteFrom('atlas_feature_entries')
  gone = entryId ? gone.where('entry_id', '=', entryId) : gone.where('feature_id', '=', featureId!)
  await gone.execute()
  let pinned = db.selectFrom('feature_tags')
    .innerJoin('atlas_entries', 'atlas_entries.sketch_id', 'feature_tags.sketch_id')
    .select(['feature_tags.feature_id', 'atlas_entries.sketch_id', 'atlas_entries.observed_at', 'atlas_entries.colongitude_deg'])
    .distinct()
  pinned = entryId ? pinned.where('atlas_entries.sketch_id', '=', entryId) : pinned.where('feature_tags.feature_id', '=', featureId!)
  await db.insertInto('atlas_feature_entries')
    .columns(['feature_id', 'entry_id', 'entry_observed_at', 'entry_colongitude_deg'])
    .expression(pinned)
    .execute()
}

/** The queries one page runs, in order (the plan test reads them; a wrapped lighting range has two). */
export function atlasPageQueries(db: Kysely<Database>, q: AtlasQuery) {
  const order = atlasOrder(q)
  const back = q.before !== undefined
  const text = q.after ?? q.before
  const cursor = text === undefined ? undefined : parseCursor(text, order)
  const ranges = lightingRanges(q)
  // The range the cursor's card lies in; the walk continues from there in the listing's direction.
  const at = cursor && ranges.length > 1 && typeof cursor.value === 'number' && cursor.value < ranges[0]![0] ? 1 : cursor ? 0 : back ? ranges.length - 1 : 0
  const walk = back ? ranges.slice(0, at + 1).reverse() : ranges.slice(at)
  return { order, back, cursor, steps: walk.map((range, i) => (limit: number) => rangeQuery(db, q, order, range, i === 0 ? cursor : undefined, back, limit)) }
}

export interface AtlasPage {
  items: AtlasCardRow[]
  /** Cursors for the next and previous page links, or null at either end. */
  next: string | null
  previous: string | null
}

/**
 * One page of the atlas: a bounded index read that resumes from the card named in the link (keyset), so
 * a deep page costs what the first one does. One row past the page says whether more follow, which spares
 * counting a large filter on every request.
 */
export async function atlasPage(db: Kysely<Database>, q: AtlasQuery): Promise<AtlasPage> {
  if (q.after && q.before) throw createError({ status: 400, message: 'A page link gives either after or before, not both.' })
  const { order, back, cursor, steps } = atlasPageQueries(db, q)
  const rows: AtlasCardRow[] = []
  for (const step of steps) {
    if (rows.length > q.perPage) break
    rows.push(...await step(q.perPage + 1 - rows.length).execute())
  }
  const more = rows.length > q.perPage
  const items = rows.slice(0, q.perPage)
  if (back) items.reverse()
  const first = items[0]
  const last = items[items.length - 1]
  const text = q.after ?? q.before ?? null
  if (back) {
    return { items, previous: more && first ? cursorOf(first, order) : null, next: last ? cursorOf(last, order) : text }
  }
  return { items, next: more && last ? cursorOf(last, order) : null, previous: cursor ? (first ? cursorOf(first, order) : text) : null }
}

/** The entries pinned with a feature, by lighting, for its page: read as the atlas feature filter is. */
export async function featureEntries(db: Kysely<Database>, featureId: string, limit: number): Promise<AtlasCardRow[]> {
  const { items } = await atlasPage(db, { feature: featureId, colongitudeMin: 0, perPage: limit })
  return items
}

// Published pages are the same for every visitor: a few hundred of them are kept, ready to send, for as
// long as browsers may keep them (max-age), and all are dropped when an entry is approved or withdrawn.
const MAX_AGE_S = 30
const pages = new Map<string, { body: string, etag: string, until: number }>()

/** Call after anything that changes what the atlas lists (approval, withdrawal, a feature merge). */
export function forgetAtlasPages(): void {
  pages.clear()
}

function cacheEntries(): number {
  return Number(useRuntimeConfig().atlasCacheEntries) || 0
}

/**
 * Answers a public read from the small cache or by building it, with an ETag (a repeat visit with the
 * same page gets 304 and no body) and a short max-age.
 */
export async function sendPublicPage(event: H3Event, key: string, build: () => Promise<unknown>): Promise<string | undefined> {
  const now = Date.now()
  let page = pages.get(key)
  if (!page || page.until < now) {
    const body = JSON.stringify(await build())
    page = { body, etag: `W/"${createHash('sha1').update(body).digest('base64url').slice(0, 22)}"`, until: now + MAX_AGE_S * 1000 }
    const room = cacheEntries()
    if (room > 0) {
      pages.delete(key)
      if (pages.size >= room) pages.delete(pages.keys().next().value!)
      pages.set(key, page)
    }
  }
  setResponseHeaders(event, { 'cache-control': `public, max-age=${MAX_AGE_S}`, 'etag': page.etag })
  const seen = getRequestHeader(event, 'if-none-match')
  if (seen && seen.split(',').some(tag => tag.trim() === page.etag)) {
    setResponseStatus(event, 304)
    return ''
  }
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return page.body
}
