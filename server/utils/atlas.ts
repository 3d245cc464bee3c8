import type { Kysely } from 'kysely'
import type { AtlasEntry, Database } from '../../db/schema'
import type { AtlasQuery } from '#shared/schemas/review'

/** The public face of an entry: never an e-mail address, never a precise coordinate. */
export function atlasCard(row: AtlasEntry) {
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

/** The published entries matching the filters, newest observation first. */
export function atlasQuery(db: Kysely<Database>, q: AtlasQuery) {
  let query = db.selectFrom('atlas_entries')
  if (q.phase) query = query.where('phase_name', '=', q.phase)
  if (q.ageMin !== undefined) query = query.where('age_days', '>=', q.ageMin)
  if (q.ageMax !== undefined) query = query.where('age_days', '<=', q.ageMax)
  const { colongitudeMin: lo, colongitudeMax: hi } = q
  if (lo !== undefined && hi !== undefined && lo > hi) {
    // The terminator's position wraps at 360°: 350 to 10 means the morning terminator near first quarter.
    query = query.where(eb => eb.or([eb('colongitude_deg', '>=', lo), eb('colongitude_deg', '<=', hi)]))
  }
  else {
    if (lo !== undefined) query = query.where('colongitude_deg', '>=', lo)
    if (hi !== undefined) query = query.where('colongitude_deg', '<=', hi)
  }
  if (q.observer) query = query.where('observer_id', '=', q.observer)
  if (q.feature) {
    const feature = q.feature
    // Driven from the feature's pins (index on feature_id, sketch_id), not by probing every entry.
    query = query.where('sketch_id', 'in', eb => eb.selectFrom('feature_tags')
      .select('feature_tags.sketch_id')
      .where('feature_tags.feature_id', '=', feature))
  }
  // Only a listed group has a name in the atlas, so only a listed group can be filtered by.
  if (q.group) query = query.where('group_id', '=', q.group).where('group_name', 'is not', null)
  if (q.instrument) query = query.where('instrument_kind', '=', q.instrument)
  if (q.from) query = query.where('observed_at', '>=', `${q.from}T00:00:00.000Z`)
  if (q.to) query = query.where('observed_at', '<=', `${q.to}T23:59:59.999Z`)
  return query
}

/**
 * One page of the atlas as the route serves it. A lighting filter lists by colongitude (the index order,
 * and the order that matters when comparing light); otherwise the newest observations come first. One row
 * past the page says whether more follow, which spares counting a large filter on every request.
 */
export function atlasPage(db: Kysely<Database>, q: AtlasQuery) {
  const byLight = q.colongitudeMin !== undefined || q.colongitudeMax !== undefined
  return atlasQuery(db, q)
    .selectAll()
    .orderBy(byLight ? 'colongitude_deg' : 'observed_at', byLight ? 'asc' : 'desc')
    .orderBy('sketch_id')
    .limit(q.perPage + 1)
    .offset((q.page - 1) * q.perPage)
}
