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
  if (!sketchHasImage(sketch)) throw createError({ status: 409, message: 'Save the sketch at least once before submitting it.' })
  const moved = await applyTransition(user, id, 'submit', comment, siteUrl(event))
  // The submitted version is kept whole in the history, and its image is drawn now for the review queue.
  await keepSubmitted(useDb(), id)
  await currentImages(useDb(), useObjectStore(), sketch)
  return moved
})
