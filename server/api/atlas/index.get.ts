import { AtlasQuery } from '#shared/schemas/review'

const validQuery = parseWith(AtlasQuery)

// Public: the published atlas, filtered by phase, lighting, feature, observer, instrument and date, one
// page at a time (the page links carry the card they continue from).
export default defineEventHandler(async (event) => {
  const q = await getValidatedQuery(event, validQuery)
  return sendPublicPage(event, `atlas ${JSON.stringify(q)}`, async () => {
    const page = await atlasPage(useDb(), q)
    return { items: page.items.map(atlasCard), next: page.next, previous: page.previous, perPage: q.perPage }
  })
})
