import { ObservationListQuery } from '#shared/schemas/observation'

const validQuery = parseWith(ObservationListQuery)
const MAX_ROWS = 50_000

// The owner's own file: precise coordinates are theirs to keep.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const q = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const rows = await filteredObservations(db, user.id, q).sorted.limit(MAX_ROWS).execute()
  const dtos = await loadObservationDtos(db, rows)
  const sites = new Map((await db.selectFrom('sites').selectAll().where('user_id', '=', user.id).execute()).map(s => [s.id, s]))
  const withPlace = dtos.map((dto) => {
    const site = sites.get(dto.site.id)
    return { ...dto, latitude: site?.latitude ?? 0, longitude: site?.longitude ?? 0, elevation: site?.elevation_m ?? 0 }
  })
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="shadowline-observations-${new Date().toISOString().slice(0, 10)}.csv"`)
  return observationsCsv(withPlace)
})
