import { mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { AddressInfo } from 'node:net'
import { createServer } from 'node:net'
import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Database } from '../../db/schema'
import { startMailCatcher } from '../../server/utils/embedded'
import { openTestDatabase } from '../support/database'
import type { Transporter } from 'nodemailer'
import { createMailTransport, deliverDueMail, enqueueMail, OUTBOX_EXPIRED, requeueMail, retryDelayMs } from '../../server/utils/mail'
import { decisionMail, passwordResetMail, verificationMail } from '../../server/utils/mailTemplates'

let db: Kysely<Database>
let closeDb: () => Promise<void>
const dir = mkdtempSync(join(tmpdir(), 'shadowline-mail-'))

/** A port with nothing listening on it: an SMTP server that is down. */
async function closedPort(): Promise<number> {
  const probe = createServer()
  await new Promise<void>(done => probe.listen(0, '127.0.0.1', done))
  const { port } = probe.address() as AddressInfo
  await new Promise(done => probe.close(done))
  return port
}

beforeAll(async () => {
  ;({ db, close: closeDb } = await openTestDatabase())
})
afterAll(async () => {
  await closeDb?.()
  rmSync(dir, { recursive: true, force: true })
})

describe('mail outbox', () => {
  it('keeps a message while the mail server is down and delivers it once it is back', async () => {
    const port = await closedPort()
    const transport = createMailTransport({ host: '127.0.0.1', port, secure: false, plain: true })
    const start = new Date('2026-12-01T20:00:00Z')
    const id = await enqueueMail(db, { to: 'lena@example.test', subject: 'Your entry was approved', text: 'Well drawn.' }, start)

    const first = await deliverDueMail(db, transport, 'Shadowline <no-reply@shadowline.test>', start)
    expect(first).toEqual({ sent: 0, retried: 1, expired: 0 })
    const waiting = await db.selectFrom('mail_outbox').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
    expect(waiting.attempts).toBe(1)
    expect(waiting.sent_at).toBeNull()
    expect(waiting.last_error).toBeTruthy()
    expect(new Date(waiting.next_attempt_at).getTime()).toBe(start.getTime() + retryDelayMs(1))

    // Not due yet: nothing is tried.
    expect(await deliverDueMail(db, transport, 'x@shadowline.test', new Date(start.getTime() + 1000)))
      .toEqual({ sent: 0, retried: 0, expired: 0 })

    const catcher = await startMailCatcher(join(dir, 'caught'), port)
    try {
      const later = new Date(start.getTime() + retryDelayMs(1) + 1)
      expect(await deliverDueMail(db, transport, 'Shadowline <no-reply@shadowline.test>', later))
        .toEqual({ sent: 1, retried: 0, expired: 0 })
      const sent = await db.selectFrom('mail_outbox').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
      expect(sent.sent_at).not.toBeNull()
      expect(sent.attempts).toBe(2)
      expect(readdirSync(join(dir, 'caught'))).toHaveLength(1)
      // Sent mail is never sent again.
      expect(await deliverDueMail(db, transport, 'x@shadowline.test', new Date(later.getTime() + 3_600_000)))
        .toEqual({ sent: 0, retried: 0, expired: 0 })
    }
    finally {
      await catcher.close()
    }
  })

  it('keeps every useful message through a day-long relay outage and delivers each once when the relay returns', async () => {
    // A relay that refuses everything until `up`, then accepts; it records what it was handed.
    let up = false
    const delivered: string[] = []
    const relay = {
      async sendMail(message: { to: string, subject: string }) {
        if (!up) throw new Error('connect ECONNREFUSED (relay down)')
        delivered.push(`${message.to}|${message.subject}`)
        return { messageId: 'x' }
      },
    } as unknown as Transporter
    const from = 'Shadowline <no-reply@shadowline.test>'
    const start = new Date('2026-12-05T18:00:00Z')
    const decision = await enqueueMail(db, { to: 'ada@example.test', ...decisionMail('Ada', 'approve', '2026-12-04', '', 'https://x.test/entries') }, start)
    const confirm = await enqueueMail(db, { to: 'bo@example.test', ...verificationMail('Bo', 'https://x.test/verify-email?token=t') }, start)
    const reset = await enqueueMail(db, { to: 'cy@example.test', ...passwordResetMail('Cy', 'https://x.test/reset-password?token=t') }, start)

    // The clock moves, not the wall: the worker's timer (NUXT_OUTBOX_INTERVAL_MS) is simulated every minute
    // through 24 hours of outage.
    let at = start
    for (let minute = 0; minute < 24 * 60; minute += 1) {
      at = new Date(start.getTime() + minute * 60_000)
      expect((await deliverDueMail(db, relay, from, at)).sent).toBe(0)
    }
    expect(delivered).toEqual([])
    // Never given up, and tried all day: with a 15-minute cap and a one-minute timer, at least every 16 minutes.
    const waiting = await db.selectFrom('mail_outbox').selectAll().where('id', 'in', [decision, confirm]).execute()
    expect(waiting.map(m => [m.sent_at, m.failed_at])).toEqual([[null, null], [null, null]])
    for (const m of waiting) expect(m.attempts).toBeGreaterThanOrEqual(Math.floor(24 * 60 / 16))
    // The reset link expired after an hour: given up as no longer useful, and said so.
    const expired = await db.selectFrom('mail_outbox').selectAll().where('id', '=', reset).executeTakeFirstOrThrow()
    expect(expired.failed_at).not.toBeNull()
    expect(new Date(expired.failed_at!).getTime()).toBeLessThanOrEqual(start.getTime() + 61 * 60_000)
    expect(expired.last_error).toBe(OUTBOX_EXPIRED)

    // The relay is back: within 15 minutes each useful message is delivered exactly once.
    up = true
    for (let minute = 1; minute <= 60; minute += 1) {
      await deliverDueMail(db, relay, from, new Date(at.getTime() + minute * 60_000))
    }
    expect(delivered.sort()).toEqual([
      'ada@example.test|Your sketch is in the atlas',
      'bo@example.test|Confirm your Shadowline e-mail address',
    ].sort())
    const sent = await db.selectFrom('mail_outbox').select(['id', 'sent_at']).where('id', 'in', [decision, confirm]).execute()
    for (const row of sent) expect(new Date(row.sent_at!).getTime()).toBeLessThanOrEqual(at.getTime() + 15 * 60_000)
  })

  it('lets an undelivered message be tried again now, but not one whose link has expired', async () => {
    const at = new Date('2026-12-07T18:00:00Z')
    const decision = await enqueueMail(db, { to: 'di@example.test', subject: 'Returned with comments', text: '…' }, at)
    await db.updateTable('mail_outbox').set({ next_attempt_at: '2026-12-07T19:00:00.000Z', attempts: 5 }).where('id', '=', decision).execute()
    expect(await requeueMail(db, decision, at)).toBe('queued')
    const row = await db.selectFrom('mail_outbox').selectAll().where('id', '=', decision).executeTakeFirstOrThrow()
    expect(row.next_attempt_at).toBe(at.toISOString())
    const reset = await enqueueMail(db, { to: 'ed@example.test', ...passwordResetMail('Ed', 'https://x.test/r?token=t') }, at)
    expect(await requeueMail(db, reset, new Date(at.getTime() + 2 * 3_600_000))).toBe('expired')
    expect(await requeueMail(db, 'a6d3e0c4-0000-4000-8000-000000000000', at)).toBe('missing')
  })

  it('backs off doubling from 30 seconds up to 15 minutes', () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000])
    expect(retryDelayMs(20)).toBe(900_000)
    expect(retryDelayMs(10_000)).toBe(900_000)
  })
})
