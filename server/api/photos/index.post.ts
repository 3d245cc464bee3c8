import { PhotoUploadFields } from '#shared/schemas/photo'
import { zonedInstant } from '#shared/observing/clock'
import { FIRST_YEAR, LAST_YEAR } from '#shared/schemas/dates'

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
  const year = takenAt.getUTCFullYear()
  if (year < FIRST_YEAR || year > LAST_YEAR) {
    throw createError({ status: 400, message: `localDate: Shadowline works with dates from ${FIRST_YEAR} to ${LAST_YEAR}; set the photo's date.` })
  }

  // Objects are written only once everything is known good, and removed again if the rows cannot be.
  const id = newId()
  const db = useDb()
  const observationId = await observationForPhoto(user.id, site, takenAt)
  const row = {
    id,
    user_id: user.id,
    observation_id: observationId,
    taken_at: takenAt.toISOString(),
    taken_at_source: source,
    width: processed.width,
    height: processed.height,
    image_key: `${photoPrefix(user.id, id)}full.webp`,
    thumb_key: `${photoPrefix(user.id, id)}thumb.webp`,
    created_at: nowIso(),
  }
  try {
    const store = useObjectStore()
    await store.put(row.image_key, processed.full, 'image/webp')
    await store.put(row.thumb_key, processed.thumb, 'image/webp')
    await db.insertInto('photos').values(row).execute()
  }
  catch (error) {
    await removeStoredObjects(db, [photoPrefix(user.id, id)])
    await dropPhotoStartedObservation(db, user.id, observationId)
    throw error
  }
  setResponseStatus(event, 201)
  return photoView(row, site)
})
