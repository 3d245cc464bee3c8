import { AtlasQuery } from '#shared/schemas/review'

const validQuery = parseWith(AtlasQuery)

// Public: the published atlas, filtered by phase, lighting, feature, observer, instrument and date.
export default defineEventHandler(async (event) => {
  const q = await getValidatedQuery(event, validQuery)
  const rows = await atlasPage(useDb(), q).execute()
  setResponseHeader(event, 'cache-control', 'public, max-age=30')
  return { items: rows.slice(0, q.perPage).map(atlasCard), hasMore: rows.length > q.perPage, page: q.page, perPage: q.perPage }
})
