import { FormationParams } from '#shared/schemas/feature'

const validParams = parseWith(FormationParams)

// Public: a reference formation, the user-named features that stand for it, and every published sketch
// with a pin inside its outline, ordered by the lighting (colongitude). A name proposed on a private draft is
// listed for its proposer only, as in the gazetteer.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validParams)
  const viewer = await currentUser(event)
  const db = useDb()
  const formation = await formationById(db, id)
  if (!formation) throw createError({ status: 404, message: 'No such formation.' })
  const [features, entries] = await Promise.all([
    db.selectFrom('features').select(['id', 'name', 'status', 'pin_count'])
      .where('formation_id', '=', id).where('merged_into', 'is', null).where(featureIsVisible(viewer?.id ?? null))
      .orderBy('name').execute(),
    db.selectFrom('atlas_entries').selectAll()
      .where('sketch_id', 'in', eb => eb.selectFrom('formation_pins').select('formation_pins.sketch_id').where('formation_pins.formation_id', '=', id))
      .orderBy('colongitude_deg').orderBy('sketch_id')
      .limit(500)
      .execute(),
  ])
  const cards = entries.map(atlasCard)
  const colongitudes = cards.map(c => c.colongitudeDeg)
  return {
    formation,
    features: features.map(f => ({ id: f.id, name: f.name, status: f.status, pinCount: f.pin_count })),
    entries: cards,
    colongitudeRange: colongitudes.length ? { min: Math.min(...colongitudes), max: Math.max(...colongitudes) } : null,
  }
})
