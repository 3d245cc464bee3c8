import { IdParams } from '#shared/schemas/auth'
import { ImageSizeQuery } from '#shared/schemas/review'

const validParams = parseWith(IdParams)
const validQuery = parseWith(ImageSizeQuery)

// Public, but only for entries in the atlas; drafts and returned entries stay private.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validParams)
  const { size } = await getValidatedQuery(event, validQuery)
  const row = await useDb().selectFrom('atlas_entries')
    .innerJoin('sketches', 'sketches.id', 'atlas_entries.sketch_id')
    .select(['sketches.raster_key', 'sketches.thumb_small_key', 'sketches.thumb_large_key'])
    .where('atlas_entries.sketch_id', '=', id)
    .executeTakeFirst()
  const key = size === 'full' ? row?.raster_key : size === 'large' ? row?.thumb_large_key : row?.thumb_small_key
  if (!key) throw createError({ status: 404, message: 'No such entry in the atlas.' })
  return sendStoredObject(event, key, 'public, max-age=3600')
})
