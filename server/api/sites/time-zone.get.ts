import { TimeZoneQuery } from '#shared/schemas/site'

const validQuery = parseWith(TimeZoneQuery)

export default defineEventHandler(async (event) => {
  await requireRole(event, 'learner')
  const { latitude, longitude } = await getValidatedQuery(event, validQuery)
  return { timeZone: timeZoneAt(latitude, longitude) }
})
