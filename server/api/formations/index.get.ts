import { FormationListQuery } from '#shared/schemas/feature'

const validQuery = parseWith(FormationListQuery)

// Public: the reference formations (IAU names of the near side), all of them or those matching a name.
export default defineEventHandler(async (event) => {
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  if (q.q) return { items: await searchFormations(db, q.q, 20) }
  // The same for everyone and changed only by a migration: let browsers keep it for an hour.
  setResponseHeader(event, 'cache-control', 'public, max-age=3600')
  return { items: await referenceFormations(db) }
})
