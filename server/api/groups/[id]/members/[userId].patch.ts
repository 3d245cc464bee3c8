import { GroupMemberParams, MemberPatch } from '#shared/schemas/group'

const params = parseWith(GroupMemberParams)
const validate = parseWith(MemberPatch)

// Approving a request (leader or co-leader) and naming co-leaders (the leader only).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { id, userId } = await getValidatedRouterParams(event, params)
  const input = await readValidatedBody(event, validate)
  await groupAccess(user, id, input.role ? 'leader' : 'co-leader')
  const db = useDb()
  const target = await db.selectFrom('group_members').selectAll()
    .where('group_id', '=', id).where('user_id', '=', userId).executeTakeFirst()
  if (!target) throw createError({ status: 404, message: 'No such member in this group.' })
  if (target.role === 'leader') throw createError({ status: 409, message: 'The leader\'s role does not change here.' })
  if (input.approve && target.status === 'pending') await addMember(db, id, userId, 'active')
  if (input.role) {
    if (target.status !== 'active' && !input.approve) throw createError({ status: 409, message: 'Approve the request first.' })
    await db.updateTable('group_members').set({ role: input.role, updated_at: nowIso() }).where('id', '=', target.id).execute()
  }
  await audit(db, { actorId: user.id, action: 'group.member-changed', subjectType: 'group', subjectId: id, detail: { member: userId, ...input } })
  return { id: userId, role: input.role ?? target.role, status: 'active' }
})
