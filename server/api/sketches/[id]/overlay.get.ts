import { selenographicToDisk } from '#shared/lunar'
import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

// Confirmed features where they fall on this sketch's disk tonight, and those near the terminator.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { view, circumstances } = await sketchForPins(user, id, 'read')
  const near = await confirmedNearTerminator(circumstances.colongitudeDeg, circumstances.subSolarLatDeg)
  const confirmed = await useDb().selectFrom('features')
    .select(['id', 'name', 'latitude', 'longitude'])
    .where('status', '=', 'confirmed')
    .where('merged_into', 'is', null)
    .where('latitude', 'is not', null)
    .execute()
  const placed = confirmed.flatMap((f) => {
    const p = selenographicToDisk(f.latitude!, f.longitude!, circumstances, view)
    return p ? [{ id: f.id, name: f.name, latitude: f.latitude!, longitude: f.longitude!, x: p.x, y: p.y }] : []
  })
  return { features: placed, nearTerminator: near }
})
