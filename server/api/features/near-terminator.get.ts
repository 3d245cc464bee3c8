import { TerminatorQuery } from '#shared/schemas/feature'

const validQuery = parseWith(TerminatorQuery)

// Public: confirmed features within a few degrees of the terminator at a colongitude — the ones worth
// looking at tonight.
export default defineEventHandler(async (event) => {
  const q = await getValidatedQuery(event, validQuery)
  return nearTerminator(await confirmedFeatures(useDb()), q.colongitude, q.subSolarLat, q.within)
})
