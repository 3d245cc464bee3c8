import type { SketchListItem } from '#shared/sketch/api'
import { SketchListQuery } from '#shared/sketch/schema'

const validQuery = parseWith(SketchListQuery)

/** The signed-in observer's own sketches, newest change first. */
export default defineEventHandler(async (event): Promise<{ items: SketchListItem[], total: number, page: number, perPage: number }> => {
  const user = await requireRole(event, 'observer')
  const { page, perPage } = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const base = db.selectFrom('sketches as k')
    .innerJoin('observations as o', 'o.id', 'k.observation_id')
    .innerJoin('sites as s', 's.id', 'o.site_id')
    .where('k.user_id', '=', user.id)
  const [rows, count] = await Promise.all([
    base.select([
      'k.id', 'k.status', 'k.version', 'k.updated_at', 'k.raster_key',
      'o.id as observation_id', 'o.observed_at', 'o.time_zone', 'o.phase_name', 'o.illuminated_fraction',
      's.name as site_name',
    ])
      .orderBy('k.updated_at', 'desc')
      .limit(perPage)
      .offset((page - 1) * perPage)
      .execute(),
    base.select(eb => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return {
    items: rows.map(row => ({
      id: row.id,
      status: row.status,
      version: row.version,
      updatedAt: row.updated_at,
      hasRaster: sketchHasImage(row),
      observation: {
        id: row.observation_id,
        observedAt: row.observed_at,
        timeZone: row.time_zone,
        siteName: row.site_name,
        phaseName: row.phase_name,
        illuminatedFraction: row.illuminated_fraction,
      },
    })),
    total: Number(count.n),
    page,
    perPage,
  }
})
