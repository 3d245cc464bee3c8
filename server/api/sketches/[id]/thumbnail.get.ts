import { SketchIdParams, ThumbnailQuery } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)
const validQuery = parseWith(ThumbnailQuery)

/** The latest save's thumbnail, read through the app so only those who may see the sketch get it. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { size } = await getValidatedQuery(event, validQuery)
  const row = await findSketch(useDb(), user, id, 'review')
  const key = size === '512' ? row?.thumb_large_key : row?.thumb_small_key
  if (!key) throw createError({ status: 404, message: 'This sketch has no saved image yet.' })
  // Each save writes new keys, so the key is a sound validator and the browser may keep its copy.
  const etag = `"${key}"`
  setResponseHeader(event, 'etag', etag)
  if (getRequestHeader(event, 'if-none-match') === etag) {
    setResponseStatus(event, 304)
    return null
  }
  return sendStoredObject(event, key, 'private, no-cache')
})
