import { JoinBody } from '#shared/schemas/group'

const validate = parseWith(JoinBody)

// Joining with the code a leader shows the class: straight in, or a request the leader approves.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const { code } = await readValidatedBody(event, validate)
  const db = useDb()
  const group = await db.selectFrom('groups').selectAll().where('join_code', '=', code).executeTakeFirst()
  if (!group) throw createError({ status: 404, message: 'No group has this join code; it may have been changed or switched off. Ask your leader for the current one.' })
  const outcome = await addMember(db, group.id, user.id, group.join_approval ? 'pending' : 'active')
  await audit(db, { actorId: user.id, action: `group.join-code.${outcome}`, subjectType: 'group', subjectId: group.id })
  return {
    groupId: group.id,
    name: group.name,
    status: outcome === 'pending' ? 'pending' : 'active',
    message: outcome === 'pending'
      ? `Your request to join ${group.name} is waiting for the leader.`
      : outcome === 'already' ? `You are already in ${group.name}.` : `Welcome to ${group.name}.`,
  }
})
