import { SKETCH_SIZE } from '#shared/sketch/frame'
import { RevisionParams } from '#shared/sketch/schema'

const validParams = parseWith(RevisionParams)

/**
 * A 256-pixel image of any stored version, rebuilt from the history and painted by the editor's painter.
 * A version never changes once stored, so the browser may keep the image for good.
 */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id, version } = await getValidatedRouterParams(event, validParams)
  const db = useDb()
  const sketch = await findSketch(db, user, id, 'read')
  if (!sketch) throw createError({ status: 404, message: 'No such sketch.' })
  const etag = `"${id}-v${version}-256"`
  setResponseHeaders(event, { 'etag': etag, 'cache-control': 'private, max-age=31536000, immutable' })
  if (getRequestHeader(event, 'if-none-match') === etag) {
    setResponseStatus(event, 304)
    return null
  }
  const state = await rebuildVersion(db, sketch, version)
  if (!state) throw createError({ status: 404, message: `This sketch has no version ${version}.` })
  setResponseHeaders(event, { 'content-type': 'image/webp', 'x-content-type-options': 'nosniff' })
  return drawThumbnail(state.strokes, SKETCH_THUMBNAIL_SIZES.small, SKETCH_SIZE)
})
