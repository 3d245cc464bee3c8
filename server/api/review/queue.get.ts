import { QueueQuery } from '#shared/schemas/review'

const validQuery = parseWith(QueueQuery)

// Submitted entries only, oldest waiting first by default.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'moderator')
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  let query = db.selectFrom('sketches')
    .innerJoin('observations', 'observations.id', 'sketches.observation_id')
    .innerJoin('users', 'users.id', 'sketches.user_id')
    .where('sketches.status', '=', 'submitted')
  if (q.phase) query = query.where('observations.phase_name', '=', q.phase)
  if (q.instrument) query = query.where('observations.instrument_kind', '=', q.instrument)
  if (q.observer) {
    query = query.where(containsLike('users.name', q.observer))
  }
  const { total } = await query.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await query
    .select([
      'sketches.id', 'sketches.submitted_at', 'sketches.user_id', 'users.name as observer',
      'observations.observed_at', 'observations.local_date', 'observations.phase_name', 'observations.illuminated_fraction',
      'observations.instrument_kind', 'observations.magnification', 'observations.aperture_mm',
    ])
    .orderBy(q.sort === 'waiting' ? 'sketches.submitted_at' : 'observations.observed_at', q.dir)
    .orderBy('sketches.id')
    .limit(q.perPage)
    .offset((q.page - 1) * q.perPage)
    .execute()
  return {
    items: rows.map(r => ({
      id: r.id,
      observer: r.observer,
      ownEntry: r.user_id === user.id,
      submittedAt: r.submitted_at,
      // To the minute: a reviewer needs no more, and seconds help no one but someone placing the site.
      observedAt: toMinute(r.observed_at),
      localDate: r.local_date,
      phaseName: r.phase_name,
      illuminatedFraction: r.illuminated_fraction,
      instrumentKind: r.instrument_kind,
    })),
    total: Number(total),
    page: q.page,
    perPage: q.perPage,
  }
})
