import { IdParams } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id } = await getValidatedRouterParams(event, validParams)
  await ownSite(user.id, id)
  const db = useDb()
  const used = await db.selectFrom('observations').select('id').where('site_id', '=', id).limit(1).executeTakeFirst()
  if (used) throw createError({ status: 409, message: 'Observations were made at this site; delete or move them first.' })
  await db.deleteFrom('sites').where('id', '=', id).where('user_id', '=', user.id).execute()
  setResponseStatus(event, 204)
  return null
})
