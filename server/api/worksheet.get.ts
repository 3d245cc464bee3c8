import { WorksheetQuery } from '#shared/schemas/observation'
import { estimateConstantOffset } from '#shared/observing/measurements'
import { lunationNights, predictedAtClockTime, trendNotes, typicalClockTime } from '#shared/observing/worksheet'
import { zonedInstant } from '#shared/observing/clock'

const validQuery = parseWith(WorksheetQuery)

// One observer's lunation: new moon to new moon, at one site (their most used, or the one asked for).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const sites = await db.selectFrom('sites').selectAll().where('user_id', '=', user.id).execute()
  if (sites.length === 0) throw createError({ status: 409, message: 'Add an observing site first.' })
  const site = q.siteId ? sites.find(s => s.id === q.siteId) : undefined
  if (q.siteId && !site) throw createError({ status: 404, message: 'No such site among yours.' })

  const anchor = q.date ? zonedInstant(q.date, '12:00', (site ?? sites[0]!).time_zone) : new Date()
  const { dates, previousNewMoon, nextNewMoon } = lunationNights(anchor, (site ?? sites[0]!).time_zone)
  let rows = await db.selectFrom('observations').selectAll()
    .where('user_id', '=', user.id)
    .where('observed_at', '>=', previousNewMoon.toISOString())
    .where('observed_at', '<', nextNewMoon.toISOString())
    .orderBy('observed_at')
    .execute()
  const chosen = site ?? sites.find(s => s.id === mostCommon(rows.map(r => r.site_id))) ?? sites[0]!
  rows = rows.filter(r => r.site_id === chosen.id)
  const observations = await loadObservationDtos(db, rows)
  const clockTime = typicalClockTime(observations.map(o => o.localTime))
  const predicted = predictedAtClockTime(dates, clockTime, observingSite(chosen))
  const offset = estimateConstantOffset(observations.flatMap(o => (o.azimuth ? [o.azimuth.residualDeg] : [])))
  return {
    site: siteDto(chosen),
    sites: sites.map(s => ({ id: s.id, name: s.name })),
    previousNewMoon: previousNewMoon.toISOString(),
    nextNewMoon: nextNewMoon.toISOString(),
    clockTime,
    nights: predicted,
    observations,
    compassOffset: offset,
    notes: trendNotes(predicted, clockTime),
  }
})

function mostCommon(ids: string[]): string | undefined {
  const counts = new Map<string, number>()
  for (const id of ids) counts.set(id, (counts.get(id) ?? 0) + 1)
  return [...counts].sort((a, b) => b[1] - a[1])[0]?.[0]
}
