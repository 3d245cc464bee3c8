import { diskToSelenographic } from '#shared/lunar'
import { IdParams } from '#shared/schemas/auth'
import { TagBody } from '#shared/schemas/feature'

const validParams = parseWith(IdParams)
const validBody = parseWith(TagBody)

// A pin is kept as drawn (disk coordinates in the sketch's view) and as a place on the Moon, worked out
// with that night's libration and axis angle, so pins from any night, instrument or view meet.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const body = await readValidatedBody(event, validBody)
  const saved = await sketchForPins(user, id, 'write')
  const { circumstances } = saved
  const view = { orientation: body.orientation ?? saved.view.orientation, flip: body.flip ?? saved.view.flip }
  const place = diskToSelenographic(body.x, body.y, circumstances, view)
  if (!place) throw createError({ status: 400, message: 'Pins must be on the Moon\'s disk: that point is beyond the limb.' })
  const db = useDb()
  let featureId = body.featureId
  if (featureId) {
    const feature = await db.selectFrom('features').select(['id', 'merged_into']).where('id', '=', featureId).executeTakeFirst()
    if (!feature) throw createError({ status: 400, message: 'featureId: No such feature.' })
    featureId = feature.merged_into ?? feature.id
  }
  else if (body.formationId) {
    const formation = await formationById(db, body.formationId)
    if (!formation) throw createError({ status: 400, message: 'formationId: No such formation.' })
    featureId = await featureForFormation(db, formation)
  }
  else {
    featureId = (await featureNamed(db, body.name!))?.id ?? await createFeature(db, { name: body.name!, description: '', proposedBy: user.id })
  }
  const tagId = newId()
  await db.insertInto('feature_tags').values({
    id: tagId,
    sketch_id: id,
    feature_id: featureId,
    user_id: user.id,
    disk_x: body.x,
    disk_y: body.y,
    view_orientation: view.orientation,
    view_flip: view.flip,
    latitude: place.lat,
    longitude: place.lon,
    created_at: nowIso(),
  }).execute()
  await pinFormations(db, { id: tagId, sketch_id: id, latitude: place.lat, longitude: place.lon })
  await recomputePosition(db, featureId)
  setResponseStatus(event, 201)
  return (await pinsOf(id)).find(p => p.id === tagId)
})
