import { mkdtempSync, rmSync } from 'node:fs'
import { createServer, type AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { DEMO_ACCOUNTS } from '../../db/seed'
import { DEMO_PUPILS } from '../../db/seedCampaign'
import { startEmbeddedS3 } from '../../server/utils/embedded'
import { Client, DEMO, startApp } from '../support/app'
import { createTestDatabase } from '../support/database'

async function freePort(): Promise<number> {
  const probe = createServer()
  await new Promise<void>(done => probe.listen(0, '127.0.0.1', done))
  const { port } = probe.address() as AddressInfo
  await new Promise(done => probe.close(done))
  return port
}

async function until<T>(what: string, check: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const value = await check()
    if (value !== undefined) return value
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`)
    await new Promise(r => setTimeout(r, 200))
  }
}

describe('start-up', () => {
  it('waits for an object store that is down, says so in /api/health, and recovers without a restart', async () => {
    const port = await freePort()
    const app = await startApp({ NUXT_S3_ENDPOINT: `http://127.0.0.1:${port}` }, { healthy: false })
    const dir = mkdtempSync(join(tmpdir(), 'shadowline-late-s3-'))
    try {
      // The first try may still be under way; then it is reported down with its reason.
      const { status, body } = await until('storage to be reported down', async () => {
        const health = await fetch(`${app.url}/api/health`)
        const answer = { status: health.status, body: await health.json() }
        return answer.body.services.storage === 'down' ? answer : undefined
      })
      expect(status).toBe(503)
      expect(body.ok).toBe(false)
      expect(body.services.storage).toBe('down')
      expect(body.services.database).toBe('up')
      expect(body.problems.storage).toBeTruthy()
      // Other requests are told what is missing rather than failing with 500.
      const atlas = await new Client(app.url).get('/api/atlas')
      expect(atlas.status).toBe(503)
      expect(atlas.body.message).toMatch(/storage/)

      // The store comes up: the same server recovers by itself.
      const s3 = await startEmbeddedS3(dir, port)
      try {
        await until('health to recover', async () => ((await fetch(`${app.url}/api/health`)).ok ? true : undefined))
        expect((await new Client(app.url).get('/api/atlas')).status).toBe(200)
        await new Client(app.url).signIn(DEMO.observer.email, DEMO.observer.password)
      }
      finally {
        await s3.close()
      }
    }
    finally {
      await app.stop()
      rmSync(dir, { recursive: true, force: true })
    }
  })

  it('seeds an empty database once when two servers start on it together', async () => {
    const shared = await createTestDatabase()
    const dir = mkdtempSync(join(tmpdir(), 'shadowline-shared-db-'))
    const url = shared.url || join(dir, 'shared.sqlite')
    try {
      const apps = await Promise.all([startApp({ NUXT_DATABASE_URL: url }), startApp({ NUXT_DATABASE_URL: url })])
      try {
        for (const app of apps) {
          const admin = new Client(app.url)
          await admin.signIn(DEMO.admin.email, DEMO.admin.password)
          const users = await admin.get('/api/admin/users')
          expect(users.status).toBe(200)
          // Seeded once: each demo account and pupil exactly once.
          expect(users.body.total).toBe(new Set([...DEMO_ACCOUNTS, ...DEMO_PUPILS].map(a => a.email)).size)
        }
      }
      finally {
        await Promise.all(apps.map(app => app.stop()))
      }
    }
    finally {
      await shared.drop()
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
