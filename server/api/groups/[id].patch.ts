import { GroupParams, GroupPatch } from '#shared/schemas/group'

const params = parseWith(GroupParams)
const validate = parseWith(GroupPatch)

export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { user, group } = await requireGroupRole(event, id, 'co-leader')
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const next = { ...group, ...input }
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('groups').set({ ...input, updated_at: nowIso() }).where('id', '=', id).execute()
    // Published entries name the group only while it is listed, and by its current name.
    await trx.updateTable('atlas_entries')
      .set({ group_name: next.visibility === 'listed' ? next.name : null })
      .where('group_id', '=', id).execute()
  })
  await audit(db, { actorId: user.id, action: 'group.changed', subjectType: 'group', subjectId: id, detail: input })
  return { id, name: next.name, description: next.description, visibility: next.visibility }
})
