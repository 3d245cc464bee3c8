import { TonightQuery } from '#shared/schemas/tonight'
import { planNight } from '#shared/observing/tonight'

const validQuery = parseWith(TonightQuery)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const q = await getValidatedQuery(event, validQuery)
  const site = await ownSite(user.id, q.siteId)
  return { site: siteDto(site), plan: planNight(q.date, observingSite(site)) }
})
