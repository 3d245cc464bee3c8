import { GroupBody } from '#shared/schemas/group'

const validate = parseWith(GroupBody)

// Any verified observer may start a group and leads it.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'observer')
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const id = newId()
  const at = nowIso()
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('groups').values({
      id, name: input.name, description: input.description, visibility: input.visibility,
      join_code: null, join_approval: 0, created_by: user.id, created_at: at, updated_at: at,
    }).execute()
    await trx.insertInto('group_members').values({
      id: newId(), group_id: id, user_id: user.id, role: 'leader', status: 'active', reminders: 0, created_at: at, updated_at: at,
    }).execute()
  })
  await audit(db, { actorId: user.id, action: 'group.created', subjectType: 'group', subjectId: id })
  setResponseStatus(event, 201)
  return { id, name: input.name, description: input.description, visibility: input.visibility, role: 'leader' }
})
