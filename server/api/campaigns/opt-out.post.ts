import { OptOutBody } from '#shared/campaigns/schema'

const validate = parseWith(OptOutBody)

// The link in every reminder: it switches that membership's reminders off, signed in or not.
export default defineEventHandler(async (event) => {
  const { token } = await readValidatedBody(event, validate)
  const membershipId = readOptOutToken(token)
  if (!membershipId) throw createError({ status: 400, message: 'This link is not valid. Switch reminders off on the group\'s page instead.' })
  const db = useDb()
  const row = await db.selectFrom('group_members').innerJoin('groups', 'groups.id', 'group_members.group_id')
    .select(['group_members.id', 'groups.name']).where('group_members.id', '=', membershipId).executeTakeFirst()
  if (!row) throw createError({ status: 400, message: 'You are no longer in this group, so no reminders will come.' })
  await db.updateTable('group_members').set({ reminders: 0, updated_at: nowIso() }).where('id', '=', row.id).execute()
  return { message: `Reminders for ${row.name} are off. You can switch them on again on the group's page.` }
})
