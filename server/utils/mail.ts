import { randomUUID } from 'node:crypto'
import type { Kysely } from 'kysely'
import nodemailer, { type Transporter } from 'nodemailer'
import type { Database } from '../../db/schema'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  /** How long after queueing the message is still worth sending; unset: always (a review decision). */
  usefulForMs?: number
}

export interface MailTransportConfig {
  host: string
  port: number
  secure: boolean
  user?: string
  pass?: string
  /** The embedded catcher speaks plain SMTP on loopback. */
  plain?: boolean
}

const LEASE_MS = 60_000
/** Why a message was never sent: its link had expired before the relay could take it. */
export const OUTBOX_EXPIRED = 'Not sent: the message had expired before the mail server could take it.'

export function createMailTransport(config: MailTransportConfig): Transporter {
  return nodemailer.createTransport({
    host: config.host,
    port: config.port,
    secure: config.secure,
    ignoreTLS: config.plain ?? false,
    auth: config.user ? { user: config.user, pass: config.pass ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  })
}

/** All mail goes through the outbox; a worker delivers it and retries failures. */
export async function enqueueMail(db: Kysely<Database>, mail: OutgoingMail, now: Date = new Date()): Promise<string> {
  const id = randomUUID()
  await db.insertInto('mail_outbox').values({
    id,
    to_address: mail.to,
    subject: mail.subject,
    text_body: mail.text,
    next_attempt_at: now.toISOString(),
    lease_until: null,
    sent_at: null,
    failed_at: null,
    last_error: null,
    created_at: now.toISOString(),
    useful_until: mail.usefulForMs === undefined ? null : new Date(now.getTime() + mail.usefulForMs).toISOString(),
  }).execute()
  return id
}

/**
 * 30 s, 1 min, 2 min … capped at 15 minutes, and tried for as long as the message is useful: mail is never
 * dropped because the relay was down for a long time, and it goes out within 15 minutes of the relay's return.
 */
export function retryDelayMs(attempts: number): number {
  return Math.min(30_000 * 2 ** Math.max(0, attempts - 1), 15 * 60 * 1000)
}

export interface DeliveryReport {
  sent: number
  retried: number
  /** Given up because the message is no longer useful (its link expired). */
  expired: number
}

/**
 * Delivers what is due. Each row is leased with a conditional update first, so
 * several app servers can run this side by side without sending a message twice.
 */
export async function deliverDueMail(
  db: Kysely<Database>,
  transport: Transporter,
  from: string,
  now: Date = new Date(),
  batch = 20,
): Promise<DeliveryReport> {
  const at = now.toISOString()
  const report: DeliveryReport = { sent: 0, retried: 0, expired: 0 }
  const due = await db.selectFrom('mail_outbox')
    .selectAll()
    .where('sent_at', 'is', null)
    .where('failed_at', 'is', null)
    .where('next_attempt_at', '<=', at)
    .where(eb => eb.or([eb('lease_until', 'is', null), eb('lease_until', '<', at)]))
    .orderBy('next_attempt_at', 'asc')
    .limit(batch)
    .execute()
  for (const mail of due) {
    const leased = await db.updateTable('mail_outbox')
      .set({ lease_until: new Date(now.getTime() + LEASE_MS).toISOString() })
      .where('id', '=', mail.id)
      .where(eb => eb.or([eb('lease_until', 'is', null), eb('lease_until', '<', at)]))
      .executeTakeFirst()
    if (Number(leased.numUpdatedRows) !== 1) continue
    if (mail.useful_until && mail.useful_until <= at) {
      await db.updateTable('mail_outbox')
        .set({ lease_until: null, failed_at: at, last_error: OUTBOX_EXPIRED })
        .where('id', '=', mail.id)
        .execute()
      report.expired += 1
      continue
    }
    const attempts = mail.attempts + 1
    try {
      await transport.sendMail({ from, to: mail.to_address, subject: mail.subject, text: mail.text_body })
      await db.updateTable('mail_outbox')
        .set({ attempts, sent_at: now.toISOString(), lease_until: null, last_error: null })
        .where('id', '=', mail.id)
        .execute()
      report.sent += 1
    }
    catch (error) {
      const message = error instanceof Error ? error.message : String(error)
      await db.updateTable('mail_outbox')
        .set({
          attempts,
          lease_until: null,
          last_error: message.slice(0, 500),
          next_attempt_at: new Date(now.getTime() + retryDelayMs(attempts)).toISOString(),
        })
        .where('id', '=', mail.id)
        .execute()
      report.retried += 1
    }
  }
  return report
}

interface MailRuntime {
  transport: Transporter
  from: string
  catcherDirectory: string | null
}

let runtime: MailRuntime | undefined
let draining: Promise<void> | null = null

export function setMailRuntime(next: MailRuntime | undefined): void {
  runtime = next
}

/** Where the embedded catcher keeps mail, or null when a real SMTP host is configured. */
export function mailCatcherDirectory(): string | null {
  return runtime?.catcherDirectory ?? null
}

/** Delivers due mail now (also run on a timer by server/plugins/outbox.ts). */
export function drainOutbox(db: Kysely<Database>): Promise<void> {
  if (!runtime) return Promise.resolve()
  const { transport, from } = runtime
  draining ??= deliverDueMail(db, transport, from)
    .then(() => undefined)
    .catch(error => console.error('[outbox]', error))
    .finally(() => {
      draining = null
    })
  return draining
}

/** Queues a message and starts delivery without waiting for it. */
export async function sendMail(db: Kysely<Database>, mail: OutgoingMail): Promise<void> {
  await enqueueMail(db, mail)
  void drainOutbox(db)
}

/**
 * An undelivered message goes back to the front of the queue (an administrator's resend). A message whose
 * link has expired is not worth sending: its owner asks for a new link instead.
 */
export async function requeueMail(db: Kysely<Database>, id: string, now: Date = new Date()): Promise<'queued' | 'expired' | 'missing'> {
  const mail = await db.selectFrom('mail_outbox').select(['useful_until', 'sent_at']).where('id', '=', id).executeTakeFirst()
  if (!mail || mail.sent_at) return 'missing'
  if (mail.useful_until && mail.useful_until <= now.toISOString()) return 'expired'
  await db.updateTable('mail_outbox')
    .set({ next_attempt_at: now.toISOString(), failed_at: null, lease_until: null })
    .where('id', '=', id)
    .where('sent_at', 'is', null)
    .execute()
  return 'queued'
}
