// The caller's groups: those they belong to, and those they asked to join and are waiting for.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'learner')
  const db = useDb()
  const rows = await db.selectFrom('group_members')
    .innerJoin('groups', 'groups.id', 'group_members.group_id')
    .select(['groups.id', 'groups.name', 'groups.description', 'groups.visibility', 'group_members.role', 'group_members.status'])
    .where('group_members.user_id', '=', user.id)
    .orderBy('groups.name')
    .execute()
  const active = rows.filter(r => r.status === 'active').map(r => r.id)
  const counts = active.length
    ? await db.selectFrom('group_members').select(['group_id', eb => eb.fn.countAll<number>().as('n')])
        .where('group_id', 'in', active).where('status', '=', 'active').groupBy('group_id').execute()
    : []
  const countOf = new Map(counts.map(c => [c.group_id, Number(c.n)]))
  return rows.map(r => ({
    id: r.id,
    name: r.name,
    description: r.status === 'active' ? r.description : '',
    visibility: r.visibility,
    role: r.role,
    status: r.status,
    members: countOf.get(r.id) ?? null,
  }))
})
