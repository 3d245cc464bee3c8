export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const rows = await useDb().selectFrom('sites').selectAll()
    .where('user_id', '=', user.id)
    .orderBy('name')
    .execute()
  return rows.map(siteDto)
})
