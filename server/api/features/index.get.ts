import { FeatureListQuery } from '#shared/schemas/feature'

const validQuery = parseWith(FeatureListQuery)

// Public: the gazetteer, searched by name and alias, or listed by name. A name proposed on a private draft is
// listed only for its proposer until a submitted or published sketch pins it.
export default defineEventHandler(async (event) => {
  const q = await getValidatedQuery(event, validQuery)
  const viewer = await currentUser(event)
  const db = useDb()
  if (q.q) return { items: await searchFeatures(db, q.q, q.perPage, q.status, viewer?.id ?? null), total: null, page: 1, perPage: q.perPage }
  let query = db.selectFrom('features').where('merged_into', 'is', null).where(featureIsVisible(viewer?.id ?? null))
  if (q.status) query = query.where('status', '=', q.status)
  const { total } = await query.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await query.selectAll().orderBy('name').orderBy('id').limit(q.perPage).offset((q.page - 1) * q.perPage).execute()
  return {
    items: rows.map(f => ({ id: f.id, name: f.name, matched: null, status: f.status, latitude: f.latitude, longitude: f.longitude, pinCount: f.pin_count, score: 0 })),
    total: Number(total),
    page: q.page,
    perPage: q.perPage,
  }
})
