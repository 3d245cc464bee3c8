import { ObservationListQuery } from '#shared/schemas/observation'

const validQuery = parseWith(ObservationListQuery)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const { query, sorted } = filteredObservations(db, user.id, q)
  const { total } = await query.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await sorted.limit(q.perPage).offset((q.page - 1) * q.perPage).execute()
  return {
    items: await loadObservationDtos(db, rows),
    total: Number(total),
    page: q.page,
    perPage: q.perPage,
  }
})
