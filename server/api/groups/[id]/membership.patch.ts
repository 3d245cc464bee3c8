import { GroupParams, MembershipPatch } from '#shared/schemas/group'

const params = parseWith(GroupParams)
const validate = parseWith(MembershipPatch)

// The member's own settings in a group: reminders on campaign evenings.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, params)
  const { membership } = await requireGroupRole(event, id, 'member')
  const { reminders } = await readValidatedBody(event, validate)
  await useDb().updateTable('group_members').set({ reminders: reminders ? 1 : 0, updated_at: nowIso() })
    .where('id', '=', membership.id).execute()
  return { reminders }
})
