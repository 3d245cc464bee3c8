import type { ColumnType, Insertable, Selectable, Updateable } from 'kysely'
import type { Role } from '../shared/roles'

// Instants are ISO 8601 UTC strings in every dialect, so the same queries run on
// SQLite and PostgreSQL and sort correctly as text.
type Instant = string
type CreatedAt = ColumnType<Instant, Instant | undefined, never>

export interface UsersTable {
  id: string
  email: string
  name: string
  password_hash: string
  role: Role
  email_verified_at: Instant | null
  disabled_at: Instant | null
  created_at: CreatedAt
  updated_at: Instant
}

export interface SitesTable {
  id: string
  user_id: string
  name: string
  latitude: number
  longitude: number
  elevation_m: number
  time_zone: string
  created_at: CreatedAt
  updated_at: Instant
}

export type TokenPurpose = 'verify-email' | 'reset-password'

export interface AuthTokensTable {
  id: string
  user_id: string
  purpose: TokenPurpose
  token_hash: string
  expires_at: Instant
  used_at: Instant | null
  created_at: CreatedAt
}

export interface SigninFailuresTable {
  id: string
  scope: 'account' | 'address'
  key: string
  at: Instant
}

export interface MailOutboxTable {
  id: string
  to_address: string
  subject: string
  text_body: string
  attempts: ColumnType<number, number | undefined, number>
  next_attempt_at: Instant
  lease_until: Instant | null
  sent_at: Instant | null
  failed_at: Instant | null
  last_error: string | null
  created_at: CreatedAt
}

export interface AuditLogTable {
  id: string
  at: Instant
  actor_id: string | null
  action: string
  subject_type: string
  subject_id: string | null
  detail: string | null
}

export interface Database {
  users: UsersTable
  sites: SitesTable
  auth_tokens: AuthTokensTable
  signin_failures: SigninFailuresTable
  mail_outbox: MailOutboxTable
  audit_log: AuditLogTable
}

export type User = Selectable<UsersTable>
export type NewUser = Insertable<UsersTable>
export type UserUpdate = Updateable<UsersTable>
export type Site = Selectable<SitesTable>
export type NewSite = Insertable<SitesTable>
export type SiteUpdate = Updateable<SitesTable>
export type OutboxMail = Selectable<MailOutboxTable>
export type AuditEntry = Selectable<AuditLogTable>
