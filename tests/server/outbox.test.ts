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
import { createMailTransport, deliverDueMail, enqueueMail, OUTBOX_MAX_ATTEMPTS, retryDelayMs } from '../../server/utils/mail'

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
    expect(first).toEqual({ sent: 0, retried: 1, failed: 0 })
    const waiting = await db.selectFrom('mail_outbox').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
    expect(waiting.attempts).toBe(1)
    expect(waiting.sent_at).toBeNull()
    expect(waiting.last_error).toBeTruthy()
    expect(new Date(waiting.next_attempt_at).getTime()).toBe(start.getTime() + retryDelayMs(1))

    // Not due yet: nothing is tried.
    expect(await deliverDueMail(db, transport, 'x@shadowline.test', new Date(start.getTime() + 1000)))
      .toEqual({ sent: 0, retried: 0, failed: 0 })

    const catcher = await startMailCatcher(join(dir, 'caught'), port)
    try {
      const later = new Date(start.getTime() + retryDelayMs(1) + 1)
      expect(await deliverDueMail(db, transport, 'Shadowline <no-reply@shadowline.test>', later))
        .toEqual({ sent: 1, retried: 0, failed: 0 })
      const sent = await db.selectFrom('mail_outbox').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
      expect(sent.sent_at).not.toBeNull()
      expect(sent.attempts).toBe(2)
      expect(readdirSync(join(dir, 'caught'))).toHaveLength(1)
      // Sent mail is never sent again.
      expect(await deliverDueMail(db, transport, 'x@shadowline.test', new Date(later.getTime() + 3_600_000)))
        .toEqual({ sent: 0, retried: 0, failed: 0 })
    }
    finally {
      await catcher.close()
    }
  })

  it('gives up after the last attempt and marks the message failed', async () => {
    const transport = createMailTransport({ host: '127.0.0.1', port: await closedPort(), secure: false, plain: true })
    let at = new Date('2026-12-02T20:00:00Z')
    const id = await enqueueMail(db, { to: 'kit@example.test', subject: 'Returned with comments', text: '…' }, at)
    let failed = 0
    for (let attempt = 1; attempt <= OUTBOX_MAX_ATTEMPTS; attempt += 1) {
      failed += (await deliverDueMail(db, transport, 'x@shadowline.test', at)).failed
      at = new Date(at.getTime() + retryDelayMs(attempt) + 1)
    }
    expect(failed).toBe(1)
    const row = await db.selectFrom('mail_outbox').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
    expect(row.failed_at).not.toBeNull()
    expect(row.attempts).toBe(OUTBOX_MAX_ATTEMPTS)
  })

  it('backs off doubling from 30 seconds up to an hour', () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000])
    expect(retryDelayMs(20)).toBe(3_600_000)
  })
})
