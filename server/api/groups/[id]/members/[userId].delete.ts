import { GroupMemberParams } from '#shared/schemas/group'

const params = parseWith(GroupMemberParams)

// Leaving (one's own id) or removing a member (leader or co-leader), or turning down a request. The
// member's observations, sketches and sites stay theirs; the group simply loses sight of them.
export default defineEventHandler(async (event) => {
  const { id, userId } = await getValidatedRouterParams(event, params)
  const user = await requireRole(event, 'learner')
  const self = userId === user.id
  const { membership } = await groupAccess(user, id, self ? 'member' : 'co-leader')
  const db = useDb()
  const target = self
    ? membership
    : await db.selectFrom('group_members').selectAll().where('group_id', '=', id).where('user_id', '=', userId).executeTakeFirst()
  if (!target) throw createError({ status: 404, message: 'No such member in this group.' })
  if (target.role === 'leader') {
    throw createError({ status: 409, message: self ? 'The leader cannot leave their own group.' : 'The leader cannot be removed.' })
  }
  if (!self && target.role === 'co-leader' && membership.role !== 'leader') {
    throw createError({ status: 403, message: 'Only the leader removes a co-leader.' })
  }
  await db.deleteFrom('group_members').where('id', '=', target.id).execute()
  await audit(db, { actorId: user.id, action: self ? 'group.left' : 'group.member-removed', subjectType: 'group', subjectId: id, detail: { member: userId } })
  setResponseStatus(event, 204)
  return null
})
