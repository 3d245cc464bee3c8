import type { Role } from '../roles'

export interface AdminUserRow {
  id: string
  name: string
  email: string
  role: Role
  verified: boolean
  disabled: boolean
  createdAt: string
}

export interface Page<T> {
  items: T[]
  total: number
  page: number
  perPage: number
}

export interface CaughtMail {
  id: string
  receivedAt: string
  from: string
  to: string
  subject: string
  text: string
}
