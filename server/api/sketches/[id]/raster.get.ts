import { SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)

/** The latest version's full image (WebP, 2048 × 2048), drawn from its shapes if not drawn yet. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const row = await findSketch(db, user, id, 'review')
  const images = row && await currentImages(db, useObjectStore(), row)
  if (!images) throw createError({ status: 404, message: 'This sketch has no saved image yet.' })
  return sendStoredObject(event, images.raster, 'private, no-cache')
})
