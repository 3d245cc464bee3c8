import { GroupParams, JoinCodeBody } from '#shared/schemas/group'

const params = parseWith(GroupParams)
const validate = parseWith(JoinCodeBody)

// A new code makes the old one useless at once; "off" switches joining by code off altogether.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { user, group } = await requireGroupRole(event, id, 'co-leader')
  const input = await readValidatedBody(event, validate)
  const db = useDb()
  const code = input.action === 'rotate' ? newJoinCode() : null
  const approval = input.approval ?? group.join_approval === 1
  await db.updateTable('groups')
    .set({ join_code: code, join_approval: approval ? 1 : 0, updated_at: nowIso() })
    .where('id', '=', id).execute()
  await audit(db, { actorId: user.id, action: `group.join-code.${input.action}`, subjectType: 'group', subjectId: id })
  return { joinCode: formatJoinCode(code), joinApproval: approval }
})
