import { GroupParams, GroupSiteBody } from '#shared/schemas/group'

const params = parseWith(GroupParams)
const validate = parseWith(GroupSiteBody)

// A shared site: every member gets their own copy at once, so nobody types coordinates.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { user } = await requireGroupRole(event, id, 'co-leader')
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const at = nowIso()
  const site = {
    id: newId(),
    group_id: id,
    name: input.name,
    latitude: input.latitude,
    longitude: input.longitude,
    elevation_m: input.elevation,
    time_zone: input.timeZone || timeZoneAt(input.latitude, input.longitude),
    created_at: at,
    updated_at: at,
  }
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('group_sites').values(site).execute()
    const members = await trx.selectFrom('group_members').select('user_id')
      .where('group_id', '=', id).where('status', '=', 'active').execute()
    for (const m of members) await ensureMemberSite(trx, m.user_id, site)
  })
  await audit(db, { actorId: user.id, action: 'group.site-added', subjectType: 'group', subjectId: id })
  setResponseStatus(event, 201)
  return groupSiteDto(site)
})
