import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

// Public: a feature, its names, and every published sketch that pins it, ordered by the lighting.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validParams)
  const viewer = await currentUser(event)
  const db = useDb()
  const feature = await db.selectFrom('features').selectAll().where('id', '=', id)
    .where(featureIsVisible(viewer?.id ?? null))
    .executeTakeFirst()
  if (!feature) throw createError({ status: 404, message: 'No such feature.' })
  if (feature.merged_into) return { mergedInto: feature.merged_into }
  const entries = await db.selectFrom('feature_tags')
    .innerJoin('atlas_entries', 'atlas_entries.sketch_id', 'feature_tags.sketch_id')
    .selectAll('atlas_entries')
    .where('feature_tags.feature_id', '=', id)
    .orderBy('atlas_entries.colongitude_deg')
    .limit(500)
    .execute()
  const cards = [...new Map(entries.map(e => [e.sketch_id, atlasCard(e)])).values()]
  const colongitudes = cards.map(c => c.colongitudeDeg)
  return {
    feature: {
      id: feature.id,
      name: feature.name,
      description: feature.description,
      status: feature.status,
      latitude: feature.latitude,
      longitude: feature.longitude,
      spreadDeg: feature.spread_deg,
      pinCount: feature.pin_count,
    },
    aliases: await featureAliases(db, id),
    entries: cards,
    colongitudeRange: colongitudes.length ? { min: Math.min(...colongitudes), max: Math.max(...colongitudes) } : null,
  }
})
