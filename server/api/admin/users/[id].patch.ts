import { IdParams, RoleChangeBody } from '#shared/schemas/auth'

const validParams = parseWith(IdParams)
const validBody = parseWith(RoleChangeBody)

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validParams)
  const change = await readValidatedBody(event, validBody)
  const db = useDb()
  const user = await db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirst()
  if (!user) throw createError({ status: 404, message: 'No such account.' })
  if (user.id === admin.id) {
    // Keeps the site from losing its last administrator by accident.
    throw createError({ status: 409, message: 'You cannot change your own role or disable your own account; ask another administrator.' })
  }
  const at = nowIso()
  await db.updateTable('users')
    .set({
      ...(change.role ? { role: change.role } : {}),
      ...(change.disabled !== undefined ? { disabled_at: change.disabled ? at : null } : {}),
      updated_at: at,
    })
    .where('id', '=', id)
    .execute()
  await audit(db, {
    actorId: admin.id,
    action: 'user.changed',
    subjectType: 'user',
    subjectId: id,
    detail: { from: { role: user.role, disabled: user.disabled_at != null }, to: change },
  })
  return { message: 'Saved.' }
})
