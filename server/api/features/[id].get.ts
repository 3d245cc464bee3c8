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
  const cards = (await featureEntries(db, id, 500)).map(atlasCard)
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
    formation: feature.formation_id ? (await formationById(db, feature.formation_id)) ?? null : null,
    aliases: await featureAliases(db, id),
    entries: cards,
    colongitudeRange: colongitudes.length ? { min: Math.min(...colongitudes), max: Math.max(...colongitudes) } : null,
  }
})
