import { SketchIdParams } from '#shared/sketch/schema'

const validParams = parseWith(SketchIdParams)

/** What the editor needs: the drawing, its view, and the observation's instant and site for the template. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const { id } = await getValidatedRouterParams(event, validParams)
  const row = await findSketch(useDb(), user, id, 'read')
  if (!row) throw createError({ status: 404, message: 'No such sketch.' })
  setResponseHeader(event, 'cache-control', 'private, no-store')
  return toSketchDetail(row, user)
})
