import { SketchIdParams, ThumbnailQuery } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)
const validQuery = parseWith(ThumbnailQuery)

/**
 * The latest version's thumbnail, read through the app so only those who may see the sketch get it; drawn
 * from the shapes when first asked for after a save.
 */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { size } = await getValidatedQuery(event, validQuery)
  const db = useDb()
  const row = await findSketch(db, user, id, 'review')
  const images = row && await currentImages(db, useObjectStore(), row)
  const key = size === '512' ? images?.large : images?.small
  if (!key) throw createError({ status: 404, message: 'This sketch has no saved image yet.' })
  // Each version's images have keys of their own, so the key is a sound validator and the browser may keep
  // its copy.
  const etag = `"${key}"`
  setResponseHeader(event, 'etag', etag)
  if (getRequestHeader(event, 'if-none-match') === etag) {
    setResponseStatus(event, 304)
    return null
  }
  return sendStoredObject(event, key, 'private, no-cache')
})
