import { IdParams } from '#shared/schemas/auth'
import { PhotoTimeBody } from '#shared/schemas/photo'
import { zonedInstant } from '#shared/observing/clock'

const validParams = parseWith(IdParams)
const validBody = parseWith(PhotoTimeBody)

// The observer corrects a capture time (a camera clock left on summer time, say); the photo then joins
// the observation nearest the corrected time.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  const body = await readValidatedBody(event, validBody)
  const { photo, site } = await ownPhoto(user.id, id)
  let takenAt: Date
  try {
    takenAt = zonedInstant(body.localDate, body.localTime, site.time_zone)
  }
  catch (error) {
    throw createError({ status: 400, message: `localTime: ${(error as Error).message}` })
  }
  const observationId = await observationForPhoto(user.id, site, takenAt)
  const next = { taken_at: takenAt.toISOString(), taken_at_source: 'observer' as const, observation_id: observationId }
  const db = useDb()
  await db.updateTable('photos').set(next).where('id', '=', id).where('user_id', '=', user.id).execute()
  // The observation the old time started, if nothing else needs it, goes.
  if (photo.observation_id !== observationId) await dropPhotoStartedObservation(db, user.id, photo.observation_id)
  return photoView({ ...photo, ...next }, site)
})
