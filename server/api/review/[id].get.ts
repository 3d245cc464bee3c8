import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

// What a moderator needs to decide: the entry, its observation and measurements, and earlier reviews. The
// observation is shown as reviewers may see it (server/utils/privacy.ts): the site rounded, times to the minute.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'moderator')
  const { id } = await getValidatedRouterParams(event, validParams)
  const sketch = await visibleEntry(user, id)
  const db = useDb()
  const observation = await db.selectFrom('observations').selectAll().where('id', '=', sketch.observation_id).executeTakeFirstOrThrow()
  const [dto] = await loadObservationDtos(db, [observation])
  const ownEntry = sketch.user_id === user.id
  const site = await db.selectFrom('sites').select(['latitude', 'longitude']).where('id', '=', observation.site_id).executeTakeFirstOrThrow()
  const observer = await db.selectFrom('users').select('name').where('id', '=', sketch.user_id).executeTakeFirstOrThrow()
  return {
    sketch: {
      id: sketch.id,
      status: sketch.status,
      version: sketch.version,
      orientation: sketch.view_orientation,
      flip: sketch.view_flip,
      hasRaster: sketchHasImage(sketch),
      submittedAt: sketch.submitted_at,
      ownEntry,
    },
    observer: observer.name,
    observation: ownEntry ? dto! : observationForReviewer(dto!, site),
    history: await entryHistory(db, sketch.id),
    pins: await pinsOf(sketch.id),
  }
})
