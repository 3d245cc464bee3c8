import { predictedAtClockTime } from '#shared/observing/worksheet'
import { localDateTimeOf } from '#shared/observing/clock'

// The caller's campaign cards (home page, Tonight): every campaign of their groups that is not over, with
// the next night, where the Moon will stand then, and the site and time to log it with.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const db = useDb()
  const rows = await db.selectFrom('campaigns')
    .innerJoin('group_members', join => join
      .onRef('group_members.group_id', '=', 'campaigns.group_id')
      .on('group_members.user_id', '=', user.id)
      .on('group_members.status', '=', 'active'))
    .innerJoin('groups', 'groups.id', 'campaigns.group_id')
    .innerJoin('group_sites', 'group_sites.id', 'campaigns.group_site_id')
    .selectAll('campaigns')
    .select(['groups.name as group_name'])
    .orderBy('campaigns.created_at', 'desc')
    .execute()
  const cards = []
  for (const row of rows) {
    const site = await db.selectFrom('group_sites').selectAll().where('id', '=', row.group_site_id).executeTakeFirstOrThrow()
    const nights = campaignNights(row)
    const today = localDateTimeOf(new Date(), site.time_zone).date
    const index = nights.findIndex(n => n >= today)
    if (index < 0) continue
    const night = nights[index]!
    const [prediction] = predictedAtClockTime([night], row.clock_time, groupObservingSite(site))
    const mySiteId = await ensureMemberSite(db, user.id, site)
    const logged = await db.selectFrom('observations').select('id')
      .where('user_id', '=', user.id).where('site_id', '=', mySiteId).where('local_date', '=', night)
      .executeTakeFirst()
    const done = await db.selectFrom('observations').select(eb => eb.fn.countAll<number>().as('n'))
      .where('user_id', '=', user.id).where('site_id', '=', mySiteId).where('local_date', 'in', nights)
      .executeTakeFirstOrThrow()
    cards.push({
      id: row.id,
      title: row.title,
      groupId: row.group_id,
      groupName: row.group_name,
      kind: row.kind,
      brief: row.brief,
      asks: { sketch: row.asks_sketch === 1, altitude: row.asks_altitude === 1, azimuth: row.asks_azimuth === 1 },
      site: { id: mySiteId, name: site.name, timeZone: site.time_zone },
      night: { number: index + 1, of: nights.length, localDate: night, clockTime: row.clock_time, isToday: night === today },
      moon: { altitudeDeg: prediction!.altitudeDeg, azimuthDeg: prediction!.azimuthDeg, illuminatedFraction: prediction!.illuminatedFraction },
      loggedObservationId: logged?.id ?? null,
      nightsLogged: Number(done.n),
    })
  }
  return cards
})
