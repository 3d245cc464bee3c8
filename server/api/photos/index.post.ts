import { PhotoUploadFields } from '#shared/schemas/photo'
import { zonedInstant } from '#shared/observing/clock'

const validFields = parseWith(PhotoUploadFields)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  // The limit holds while reading, so an oversized upload is refused before it fills memory.
  const body = await readLimitedBody(event, PHOTO_MAX_BYTES + 64 * 1024, `Photos are limited to ${PHOTO_MAX_BYTES / 1024 / 1024} MB.`)
  const { fields: text, files } = await readMultipart(event, body, 'photo')
  const file = files.get('file')
  if (!file) throw createError({ status: 400, message: 'file: Choose a photo to upload.' })
  const fields = validated(validFields, text)
  const site = await chosenSite(user.id, fields.siteId)

  let processed
  try {
    processed = await processPhoto(Buffer.from(file.bytes), site.time_zone)
  }
  catch (error) {
    if (error instanceof PhotoRejected) throw createError({ status: error.status, message: error.message })
    throw error
  }
  let takenAt = processed.exifTakenAt
  let source: 'exif' | 'observer' | 'upload' = takenAt ? 'exif' : 'upload'
  if (fields.localDate && fields.localTime) {
    try {
      takenAt = zonedInstant(fields.localDate, fields.localTime, site.time_zone)
    }
    catch (error) {
      throw createError({ status: 400, message: `localTime: ${(error as Error).message}` })
    }
    source = 'observer'
  }
  takenAt ??= new Date()

  const id = newId()
  const store = useObjectStore()
  const imageKey = `photos/${user.id}/${id}/full.webp`
  const thumbKey = `photos/${user.id}/${id}/thumb.webp`
  await store.put(imageKey, processed.full, 'image/webp')
  await store.put(thumbKey, processed.thumb, 'image/webp')
  const observationId = await observationForPhoto(user.id, site, takenAt)
  const row = {
    id,
    user_id: user.id,
    observation_id: observationId,
    taken_at: takenAt.toISOString(),
    taken_at_source: source,
    width: processed.width,
    height: processed.height,
    image_key: imageKey,
    thumb_key: thumbKey,
    created_at: nowIso(),
  }
  await useDb().insertInto('photos').values(row).execute()
  setResponseStatus(event, 201)
  return photoView(row, site)
})
