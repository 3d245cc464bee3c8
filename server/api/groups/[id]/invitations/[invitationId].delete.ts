import { InvitationParams } from '#shared/schemas/group'

const params = parseWith(InvitationParams)

export default defineEventHandler(async (event) => {
  const { id, invitationId } = await getValidatedRouterParams(event, params)
  const { user } = await requireGroupRole(event, id, 'co-leader')
  const db = useDb()
  const result = await db.updateTable('group_invitations').set({ revoked_at: nowIso() })
    .where('id', '=', invitationId).where('group_id', '=', id)
    .where('used_at', 'is', null).where('revoked_at', 'is', null)
    .executeTakeFirst()
  if (Number(result.numUpdatedRows) !== 1) throw createError({ status: 404, message: 'No such open invitation in this group.' })
  await audit(db, { actorId: user.id, action: 'group.invitation-revoked', subjectType: 'group', subjectId: id })
  setResponseStatus(event, 204)
  return null
})
