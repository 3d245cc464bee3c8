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

/** A message the outbox has not delivered; its text is not shown, as it may hold a sign-in link. */
export interface UndeliveredMail {
  id: string
  to: string
  subject: string
  queuedAt: string
  attempts: number
  nextAttemptAt: string
  lastError: string | null
  /** Set when the outbox gave the message up because its link had expired. */
  gaveUpAt: string | null
  usefulUntil: string | null
}

export interface CaughtMail {
  id: string
  receivedAt: string
  from: string
  to: string
  subject: string
  text: string
}
