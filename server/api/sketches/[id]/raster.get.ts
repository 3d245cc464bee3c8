import { SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)

/** The latest save's full image (WebP, 2048 × 2048). */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const row = await findSketch(useDb(), user, id, 'review')
  if (!row?.raster_key) throw createError({ status: 404, message: 'This sketch has no saved image yet.' })
  return sendStoredObject(event, row.raster_key, 'private, no-cache')
})
