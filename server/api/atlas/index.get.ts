import { AtlasQuery } from '#shared/schemas/review'

const validQuery = parseWith(AtlasQuery)

// Public: the published atlas, filtered by phase, lighting, feature, observer, instrument and date.
export default defineEventHandler(async (event) => {
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const query = atlasQuery(db, q)
  const { total } = await query.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await query.selectAll()
    .orderBy('observed_at', 'desc')
    .orderBy('sketch_id')
    .limit(q.perPage)
    .offset((q.page - 1) * q.perPage)
    .execute()
  setResponseHeader(event, 'cache-control', 'public, max-age=30')
  return { items: rows.map(atlasCard), total: Number(total), page: q.page, perPage: q.perPage }
})
