import type { UndeliveredMail } from '#shared/types/api'

// Mail the relay has not taken yet, oldest first, so an administrator sees an outage and can resend.
export default defineEventHandler(async (event): Promise<UndeliveredMail[]> => {
  await requireRole(event, 'admin')
  const rows = await useDb().selectFrom('mail_outbox')
    .select(['id', 'to_address', 'subject', 'created_at', 'attempts', 'next_attempt_at', 'last_error', 'failed_at', 'useful_until'])
    .where('sent_at', 'is', null)
    .orderBy('created_at', 'asc')
    .limit(200)
    .execute()
  return rows.map(row => ({
    id: row.id,
    to: row.to_address,
    subject: row.subject,
    queuedAt: row.created_at,
    attempts: row.attempts,
    nextAttemptAt: row.next_attempt_at,
    lastError: row.last_error,
    gaveUpAt: row.failed_at,
    usefulUntil: row.useful_until,
  }))
})
