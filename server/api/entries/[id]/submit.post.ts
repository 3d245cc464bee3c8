import { IdParams } from '#shared/schemas/auth'
import { SubmitBody } from '#shared/schemas/review'

const validParams = parseWith(IdParams)
const validBody = parseWith(SubmitBody)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const { comment } = await readValidatedBody(event, validBody)
  const sketch = await visibleEntry(user, id)
  if (sketch.user_id !== user.id) throw createError({ status: 404, message: 'No such entry among yours.' })
  if (!sketch.raster_key) throw createError({ status: 409, message: 'Save the sketch at least once before submitting it.' })
  return applyTransition(user, id, 'submit', comment, siteUrl(event))
})
