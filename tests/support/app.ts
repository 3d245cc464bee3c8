import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { getRandomPort } from 'get-port-please'
import { simpleParser } from 'mailparser'
import { createTestDatabase } from './database'

const root = resolve(import.meta.dirname, '../..')
const entry = join(root, '.output/server/index.mjs')

export interface RunningApp {
  url: string
  dataDir: string
  /** What the server has printed so far. */
  output(): string
  stop(): Promise<void>
}

/**
 * Starts the built server (`npm run build` first) on a free port with its own
 * data folder, embedded S3 and mail catcher, and the demo accounts. With
 * TEST_POSTGRES_URL set (scripts/run-tests.mjs does) the app gets a fresh
 * PostgreSQL database instead of its SQLite file.
 */
export async function startApp(env: Record<string, string> = {}, options: { healthy?: boolean } = {}): Promise<RunningApp> {
  if (!existsSync(entry)) throw new Error('Build the app first: npm run build')
  const port = await getRandomPort('127.0.0.1')
  const dataDir = mkdtempSync(join(tmpdir(), 'shadowline-test-'))
  const url = `http://127.0.0.1:${port}`
  const database = await createTestDatabase()
  // tests/support/sqliteOnPostgres.ts finds the database of this data folder here.
  if (database.url) writeFileSync(join(dataDir, 'database-url'), database.url)
  const child: ChildProcess = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      NUXT_DATA_DIR: dataDir,
      NUXT_SEED_DEMO: 'true',
      NUXT_SESSION_PASSWORD: 'test-session-password-that-is-long-enough-0123456789',
      NUXT_S3_EMBEDDED_PORT: '0',
      NUXT_SMTP_EMBEDDED_PORT: '0',
      NUXT_OUTBOX_INTERVAL_MS: '1000',
      NUXT_PUBLIC_SITE_URL: url,
      ...(database.url ? { NUXT_DATABASE_URL: database.url } : {}),
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  const collect = (chunk: Buffer) => {
    output += chunk.toString()
  }
  child.stdout?.on('data', collect)
  child.stderr?.on('data', collect)
  const exited = new Promise<number | null>(done => child.once('exit', code => done(code)))

  const deadline = Date.now() + 60_000
  for (;;) {
    // By default the app must be healthy; `healthy: false` waits only until it answers (a test of start-up).
    const ok = await fetch(`${url}/api/health`).then(r => r.ok || options.healthy === false).catch(() => false)
    if (ok) break
    if (child.exitCode !== null || Date.now() > deadline) {
      child.kill('SIGKILL')
      await database.drop()
      throw new Error(`The app did not start:\n${output}`)
    }
    await new Promise(r => setTimeout(r, 150))
  }
  return {
    url,
    dataDir,
    output: () => output,
    async stop() {
      child.kill('SIGTERM')
      const timer = setTimeout(() => child.kill('SIGKILL'), 5000)
      await exited
      clearTimeout(timer)
      await database.drop()
      rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

/** A user agent with its own cookie jar, talking JSON to the app. */
export class Client {
  private cookies = new Map<string, string>()

  constructor(private readonly base: string) {}

  async request(method: string, path: string, body?: unknown, extraHeaders: Record<string, string> = {}): Promise<{ status: number, body: any, headers: Headers }> {
    const headers: Record<string, string> = { accept: 'application/json', ...extraHeaders }
    if (body !== undefined) headers['content-type'] = 'application/json'
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const response = await fetch(this.base + path, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      redirect: 'manual',
    })
    for (const cookie of response.headers.getSetCookie()) {
      const [pair] = cookie.split(';')
      const at = pair!.indexOf('=')
      const name = pair!.slice(0, at)
      const value = pair!.slice(at + 1)
      if (value === '' || /max-age=0/i.test(cookie)) this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
    const text = await response.text()
    let parsed: unknown = text
    try {
      parsed = JSON.parse(text)
    }
    catch { /* not JSON */ }
    return { status: response.status, body: parsed, headers: response.headers }
  }

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  get(path: string) {
    return this.request('GET', path)
  }

  post(path: string, body?: unknown) {
    return this.request('POST', path, body ?? {})
  }

  patch(path: string, body?: unknown) {
    return this.request('PATCH', path, body ?? {})
  }

  async signIn(email: string, password: string) {
    const answer = await this.post('/api/auth/sign-in', { email, password })
    if (answer.status !== 200) throw new Error(`sign-in as ${email} failed: ${answer.status} ${JSON.stringify(answer.body)}`)
    return answer
  }
}

export interface CaughtMessage {
  to: string
  subject: string
  text: string
}

export async function caughtMail(dataDir: string): Promise<CaughtMessage[]> {
  const dir = join(dataDir, 'mail')
  if (!existsSync(dir)) return []
  const names = readdirSync(dir).filter(n => n.endsWith('.eml')).sort()
  return Promise.all(names.map(async (name) => {
    const parsed = await simpleParser(readFileSync(join(dir, name)))
    const to = Array.isArray(parsed.to) ? parsed.to.map(a => a.text).join(', ') : parsed.to?.text ?? ''
    return { to, subject: parsed.subject ?? '', text: parsed.text ?? '' }
  }))
}

/** Waits until the catcher holds a message to `to` whose subject matches. */
export async function waitForMail(dataDir: string, to: string, subject: RegExp, timeoutMs = 20_000): Promise<CaughtMessage> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const found = (await caughtMail(dataDir)).find(m => m.to.includes(to) && subject.test(m.subject))
    if (found) return found
    if (Date.now() > deadline) throw new Error(`No mail to ${to} matching ${subject}`)
    await new Promise(r => setTimeout(r, 100))
  }
}

export function linkIn(text: string, path: string): string {
  const match = text.match(new RegExp(`https?://\\S+${path}\\?token=[\\w-]+`))
  if (!match) throw new Error(`No ${path} link in:\n${text}`)
  return match[0]
}

export const DEMO = {
  admin: { email: 'admin@shadowline.test', password: 'moonlit-admin' },
  moderator: { email: 'moderator@shadowline.test', password: 'moonlit-moderator' },
  observer: { email: 'observer@shadowline.test', password: 'moonlit-observer' },
  learner: { email: 'learner@shadowline.test', password: 'moonlit-learner' },
} as const
