import { UserListQuery } from '#shared/schemas/admin'
import type { AdminUserRow, Page } from '#shared/types/api'

const validate = parseWith(UserListQuery)

export default defineEventHandler(async (event): Promise<Page<AdminUserRow>> => {
  await requireRole(event, 'admin')
  const query = await getValidatedQuery(event, validate)
  const db = useDb()
  let base = db.selectFrom('users')
  if (query.role) base = base.where('role', '=', query.role)
  if (query.q) {
    const text = query.q
    base = base.where(eb => eb.or([containsLike('name', text), containsLike('email', text)]))
  }
  const { total } = await base.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await base
    .select(['id', 'name', 'email', 'role', 'email_verified_at', 'disabled_at', 'created_at'])
    .orderBy('created_at', 'desc')
    .orderBy('id')
    .limit(query.perPage)
    .offset((query.page - 1) * query.perPage)
    .execute()
  return {
    items: rows.map(r => ({
      id: r.id,
      name: r.name,
      email: r.email,
      role: r.role,
      verified: r.email_verified_at != null,
      disabled: r.disabled_at != null,
      createdAt: r.created_at,
    })),
    total: Number(total),
    page: query.page,
    perPage: query.perPage,
  }
})
