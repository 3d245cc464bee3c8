import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'

export interface AuditInput {
  actorId: string | null
  action: string
  subjectType: string
  subjectId?: string | null
  detail?: Record<string, unknown>
}

/** Appends to the audit log; entries are never updated or deleted. */
export async function audit(db: Kysely<Database>, entry: AuditInput): Promise<void> {
  await db.insertInto('audit_log').values({
    id: randomUUID(),
    at: new Date().toISOString(),
    actor_id: entry.actorId,
    action: entry.action,
    subject_type: entry.subjectType,
    subject_id: entry.subjectId ?? null,
    detail: entry.detail ? JSON.stringify(entry.detail) : null,
  }).execute()
}
