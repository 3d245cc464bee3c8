import { z } from 'zod'
import { CampaignParams } from '#shared/campaigns/schema'

const params = parseWith(CampaignParams.extend({ sketchId: z.uuid('Unknown sketch.') }))

// A member's sketch thumbnail for the group's leaders, only when the sketch belongs to an observation the
// campaign covers.
export default defineEventHandler(async (event) => {
  const { id, sketchId } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const access = await campaignAccess(user, id, 'co-leader')
  const db = useDb()
  const row = await db.selectFrom('sketches')
    .select(['id', 'version', 'raster_key', 'thumb_large_key', 'thumb_small_key', 'raster_version'])
    .where('id', '=', sketchId)
    .where('observation_id', 'in', campaignObservations(db, access.campaign).select('observations.id'))
    .executeTakeFirst()
  if (!row) throw createError({ status: 404, message: 'No such sketch in this campaign.' })
  // Saves do not draw images; the current version's thumbnail is drawn from the shapes when first asked for.
  const images = await currentImages(db, useObjectStore(), row)
  if (!images) throw createError({ status: 404, message: 'This sketch has no saved image yet.' })
  return sendStoredObject(event, images.small, 'private, no-cache')
})
