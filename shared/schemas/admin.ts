import { z } from 'zod'
import { ROLES } from '../roles'

export const UserListQuery = z.object({
  q: z.string().trim().max(100).optional(),
  role: z.enum(ROLES).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  perPage: z.coerce.number().int().min(1).max(100).default(25),
})

export type UserListQuery = z.infer<typeof UserListQuery>
