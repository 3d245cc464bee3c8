// One smoke test on the development server (`nuxt dev`), the first command a new contributor runs: the sketch
// desk opens, reloads and opens again directly, and no offline worker is left to serve stale development
// assets. Slow (the dev server compiles on demand), so it stays to one page.

import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { getRandomPort } from 'get-port-please'
import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { DEMO } from '../support/app'
import { artifact, launchBrowser } from '../support/browser'

const root = resolve(import.meta.dirname, '../..')
let child: ChildProcess | undefined
let browser: Browser
let url = ''
let dataDir = ''
let output = ''

beforeAll(async () => {
  const port = await getRandomPort('127.0.0.1')
  dataDir = mkdtempSync(join(tmpdir(), 'shadowline-dev-'))
  url = `http://127.0.0.1:${port}`
  child = spawn(process.execPath, [join(root, 'node_modules/nuxt/bin/nuxt.mjs'), 'dev', '--port', String(port), '--host', '127.0.0.1'], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'development',
      NUXT_DATA_DIR: dataDir,
      NUXT_S3_EMBEDDED_PORT: '0',
      NUXT_SMTP_EMBEDDED_PORT: '0',
      NUXT_SESSION_PASSWORD: 'test-session-password-that-is-long-enough-0123456789',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  })
  child.stdout?.on('data', (c: Buffer) => (output += c.toString()))
  child.stderr?.on('data', (c: Buffer) => (output += c.toString()))
  const deadline = Date.now() + 420_000
  for (;;) {
    if (await fetch(`${url}/api/health`).then(r => r.ok).catch(() => false)) break
    if (child.exitCode !== null || Date.now() > deadline) throw new Error(`nuxt dev did not start:\n${output.slice(-4000)}`)
    await new Promise(r => setTimeout(r, 1000))
  }
  browser = await launchBrowser()
}, 480_000)

afterAll(async () => {
  await browser?.close()
  if (child?.pid) {
    // The dev server runs its own workers: end the whole process group it leads.
    try {
      process.kill(-child.pid, 'SIGTERM')
    }
    catch { /* already gone */ }
  }
  if (dataDir) rmSync(dataDir, { recursive: true, force: true })
})

it('under nuxt dev, the sketch desk opens, reloads and opens directly, with no offline worker', async () => {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  const errors: string[] = []
  const page = await context.newPage()
  page.on('console', m => m.type() === 'error' && errors.push(m.text()))
  page.on('pageerror', e => errors.push(e.message))
  // Signed in over the API: the dev server may reload a page while it first optimises dependencies.
  const signIn = await context.request.post(`${url}/api/auth/sign-in`, { data: { email: DEMO.observer.email, password: DEMO.observer.password }, timeout: 300_000 })
  expect(signIn.status()).toBe(200)
  const list = await (await context.request.get(`${url}/api/observations`)).json() as { items: { id: string }[] }
  const created = await context.request.post(`${url}/api/sketches`, { data: { observationId: list.items[0]!.id } })
  expect(created.status()).toBe(201)
  const { id } = await created.json() as { id: string }

  await page.goto(`${url}/sketches/${id}`, { timeout: 300_000 })
  await page.getByTestId('sketch-canvas').waitFor({ timeout: 300_000 })
  await page.reload({ timeout: 300_000 })
  await page.getByTestId('sketch-canvas').waitFor({ timeout: 120_000 })
  const direct = await context.newPage()
  direct.on('console', m => m.type() === 'error' && errors.push(m.text()))
  await direct.goto(`${url}/sketches/${id}`, { timeout: 300_000 })
  await direct.getByTestId('sketch-canvas').waitFor({ timeout: 120_000 })
  await direct.reload({ timeout: 300_000 })
  await direct.getByTestId('sketch-canvas').waitFor({ timeout: 120_000 })
  expect(await direct.evaluate(async () => (await navigator.serviceWorker.getRegistrations()).length)).toBe(0)
  expect(await direct.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(false)
  expect(errors.filter(e => /MIME type|dynamically imported module/i.test(e))).toEqual([])
  await direct.screenshot({ path: artifact('sketch-desk-dev.png') })
  await context.close()
}, 900_000)
