import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { randomBytes } from 'node:crypto'
import { join, resolve } from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import type { Kysely } from 'kysely'
import { createDatabase } from '../../db/connect'
import type { Database } from '../../db/schema'
import { migrateToLatest } from '../../db/migrate'
import { seedDemo } from '../../db/seed'

export type Dependency = 'database' | 'storage' | 'mail'
export type DependencyState = 'starting' | 'up' | 'down'

export interface ServiceStatus {
  ready: boolean
  services: Record<Dependency, DependencyState>
  /** Why a dependency is down, for the operator (never user data). */
  problems: Partial<Record<Dependency, string>>
}

const status: ServiceStatus = {
  ready: false,
  services: { database: 'starting', storage: 'starting', mail: 'starting' },
  problems: {},
}
let ready: Promise<void> | undefined
let stopping = false
const closers: (() => Promise<void>)[] = []

export function serviceStatus(): ServiceStatus {
  return { ready: status.ready, services: { ...status.services }, problems: { ...status.problems } }
}

export function markService(name: Dependency, state: DependencyState, problem?: string): void {
  status.services[name] = state
  status.problems = Object.fromEntries(Object.entries(status.problems).filter(([key]) => key !== name))
  if (state === 'down' && problem) status.problems[name] = problem.slice(0, 300)
}

/** Resolves once start-up has finished; requests wait for it (server/middleware/00.ready.ts). */
export function whenReady(): Promise<void> {
  return ready ?? Promise.resolve()
}

export function startServices(): Promise<void> {
  ready ??= start()
  return ready
}

export async function stopServices(): Promise<void> {
  stopping = true
  while (closers.length) await closers.pop()!().catch(() => undefined)
}

/** 1 s, 2 s, 4 s … capped at 30 s: a dependency that comes back is picked up within half a minute. */
export function startupRetryDelayMs(attempt: number): number {
  return Math.min(1000 * 2 ** Math.max(0, attempt - 1), 30_000)
}

/**
 * Runs one start-up step until it succeeds, marking its dependency down (with the reason) between tries, so
 * the server that started while the database or the object store was unreachable recovers by itself.
 */
async function untilDone<T>(dependency: Dependency, step: string, work: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await work()
    }
    catch (error) {
      if (stopping) throw error
      const reason = error instanceof Error ? error.message : String(error)
      markService(dependency, 'down', `${step}: ${reason}`)
      const wait = startupRetryDelayMs(attempt)
      console.error(`[shadowline] ${step} failed (${reason}); trying again in ${wait / 1000} s`)
      await sleep(wait)
    }
  }
}

function dataDirectory(): string {
  const dir = resolve(useRuntimeConfig().dataDir || '.data')
  mkdirSync(dir, { recursive: true })
  return dir
}

/** A fresh clone has no secret: make one and keep it under the data folder. */
function ensureSessionPassword(dataDir: string): void {
  const config = useRuntimeConfig()
  if (process.env.NUXT_SESSION_PASSWORD || config.session.password) return
  const file = join(dataDir, 'session-secret')
  if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 })
  process.env.NUXT_SESSION_PASSWORD = readFileSync(file, 'utf8').trim()
}

function shouldSeed(): boolean {
  const setting = String(useRuntimeConfig().seedDemo)
  if (setting === 'true') return true
  if (setting === 'false') return false
  return import.meta.dev
}

/**
 * Seeds the demo into an empty database in one transaction. When several servers start on one new database
 * together, one wins; the others' inserts fail on the unique keys, roll back, and find the demo there.
 */
export async function seedOnce(db: Kysely<Database>): Promise<boolean> {
  try {
    return await db.transaction().execute(trx => seedDemo(trx, hashPassword))
  }
  catch (error) {
    const someone = await db.selectFrom('users').select('id').limit(1).executeTakeFirst()
    if (someone) return false
    throw error
  }
}

/** Warns when session cookies would cross a network in clear. */
function warnAboutPlainHttp(): void {
  const configured = String(useRuntimeConfig().public.siteUrl ?? '')
  const host = process.env.HOST || process.env.NITRO_HOST || ''
  if (configured.startsWith('http:') && !isLocalHost(new URL(configured).host)) {
    console.warn(`[shadowline] NUXT_PUBLIC_SITE_URL is plain http (${configured}): passwords and session cookies cross the network unencrypted. Serve the site over https (see README, "Running behind TLS").`)
  }
  else if (!configured && !isLocalHost(host || '0.0.0.0')) {
    console.warn('[shadowline] Listening beyond this machine without NUXT_PUBLIC_SITE_URL: sign-ins over plain http work, but passwords and session cookies cross the network unencrypted. Serve the site over https (see README, "Running behind TLS").')
  }
}

async function start(): Promise<void> {
  const config = useRuntimeConfig()
  const dataDir = dataDirectory()
  ensureSessionPassword(dataDir)
  warnAboutPlainHttp()

  const db = await untilDone('database', 'opening the database', async () => {
    const opened = await createDatabase({ url: config.databaseUrl, dataDir })
    try {
      await migrateToLatest(opened)
      return opened
    }
    catch (error) {
      await opened.destroy().catch(() => undefined)
      throw error
    }
  })
  setDb(db)
  closers.push(() => db.destroy())
  const seeded = shouldSeed() && await untilDone('database', 'seeding the demo', () => seedOnce(db))
  markService('database', 'up')

  let endpoint = config.s3.endpoint
  if (!endpoint) {
    const s3 = await untilDone('storage', 'starting the embedded S3', () => startEmbeddedS3(join(dataDir, 's3'), Number(config.s3.embeddedPort)))
    endpoint = s3.endpoint
    closers.push(s3.close)
  }
  const store = createObjectStore({
    endpoint,
    region: config.s3.region,
    bucket: config.s3.bucket,
    accessKeyId: config.s3.accessKeyId || 'S3RVER',
    secretAccessKey: config.s3.secretAccessKey || 'S3RVER',
    forcePathStyle: config.s3.forcePathStyle !== 'false',
  })
  await untilDone('storage', 'reaching the object store', () => store.ensureBucket())
  setObjectStore(store)
  if (seeded) {
    const sketches = await untilDone('storage', 'storing the demo sketches', () => seedDemoSketches(db, store))
    console.info(`[shadowline] demo data seeded (${sketches} sketches)`)
  }
  markService('storage', 'up')

  if (config.smtp.host) {
    setMailRuntime({
      transport: createMailTransport({
        host: config.smtp.host,
        port: Number(config.smtp.port),
        secure: config.smtp.secure === 'true',
        user: config.smtp.user,
        pass: config.smtp.pass,
      }),
      from: config.smtp.from,
      catcherDirectory: null,
    })
  }
  else {
    const catcher = await untilDone('mail', 'starting the mail catcher', () => startMailCatcher(join(dataDir, 'mail'), Number(config.smtp.embeddedPort)))
    closers.push(catcher.close)
    setMailRuntime({
      transport: createMailTransport({ host: '127.0.0.1', port: catcher.port, secure: false, plain: true }),
      from: config.smtp.from,
      catcherDirectory: catcher.directory,
    })
  }
  // A relay that is down does not stop the site: the outbox keeps the mail until it is back.
  markService('mail', 'up')
  status.ready = true
}
