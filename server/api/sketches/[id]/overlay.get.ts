import { selenographicToDisk } from '#shared/lunar'
import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

// Confirmed features where they fall on this sketch's disk tonight, and those near the terminator.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { view, circumstances } = await sketchForPins(user, id, 'read')
  const confirmed = await confirmedFeatures(useDb())
  const placed = confirmed.flatMap((f) => {
    const p = selenographicToDisk(f.latitude, f.longitude, circumstances, view)
    return p ? [{ ...f, x: p.x, y: p.y }] : []
  })
  return { features: placed, nearTerminator: nearTerminator(confirmed, circumstances.colongitudeDeg, circumstances.subSolarLatDeg) }
})
