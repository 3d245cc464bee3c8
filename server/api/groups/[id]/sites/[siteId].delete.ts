import { GroupSiteParams } from '#shared/schemas/group'

const params = parseWith(GroupSiteParams)

// Members keep their copies (their observations point at them); the group stops offering the site.
export default defineEventHandler(async (event) => {
  const { id, siteId } = await getValidatedRouterParams(event, params)
  const { user } = await requireGroupRole(event, id, 'co-leader')
  await groupSiteOf(id, siteId)
  const db = useDb()
  const used = await db.selectFrom('campaigns').select('id').where('group_site_id', '=', siteId).executeTakeFirst()
  if (used) throw createError({ status: 409, message: 'A campaign observes from this site; it cannot be removed.' })
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('sites').set({ group_site_id: null }).where('group_site_id', '=', siteId).execute()
    await trx.deleteFrom('group_sites').where('id', '=', siteId).execute()
  })
  await audit(db, { actorId: user.id, action: 'group.site-removed', subjectType: 'group', subjectId: id })
  setResponseStatus(event, 204)
  return null
})
