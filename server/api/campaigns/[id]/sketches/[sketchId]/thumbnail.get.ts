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
  const row = await db.selectFrom('sketches').select(['thumb_small_key'])
    .where('id', '=', sketchId)
    .where('observation_id', 'in', campaignObservations(db, access.campaign).select('observations.id'))
    .executeTakeFirst()
  if (!row?.thumb_small_key) throw createError({ status: 404, message: 'No such sketch in this campaign.' })
  return sendStoredObject(event, row.thumb_small_key, 'private, no-cache')
})
