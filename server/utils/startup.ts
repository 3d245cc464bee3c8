import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { randomBytes } from 'node:crypto'
import { join, resolve } from 'node:path'
import { createDatabase } from '../../db/connect'
import { migrateToLatest } from '../../db/migrate'
import { seedDemo } from '../../db/seed'

let ready: Promise<void> | undefined
const closers: (() => Promise<void>)[] = []

/** Requests wait for this (server/middleware/00.ready.ts). */
export function whenReady(): Promise<void> {
  return ready ?? Promise.resolve()
}

export function startServices(): Promise<void> {
  ready ??= start()
  return ready
}

export async function stopServices(): Promise<void> {
  while (closers.length) await closers.pop()!().catch(() => undefined)
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

async function start(): Promise<void> {
  const config = useRuntimeConfig()
  const dataDir = dataDirectory()
  ensureSessionPassword(dataDir)

  const db = await createDatabase({ url: config.databaseUrl, dataDir })
  await migrateToLatest(db)
  setDb(db)
  closers.push(() => db.destroy())
  const seeded = shouldSeed() && await seedDemo(db, hashPassword)

  let endpoint = config.s3.endpoint
  if (!endpoint) {
    const s3 = await startEmbeddedS3(join(dataDir, 's3'), Number(config.s3.embeddedPort))
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
  await store.ensureBucket()
  setObjectStore(store)
  if (seeded) {
    const sketches = await seedDemoSketches(db, store)
    console.info(`[shadowline] demo data seeded (${sketches} sketches)`)
  }

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
    const catcher = await startMailCatcher(join(dataDir, 'mail'), Number(config.smtp.embeddedPort))
    closers.push(catcher.close)
    setMailRuntime({
      transport: createMailTransport({ host: '127.0.0.1', port: catcher.port, secure: false, plain: true }),
      from: config.smtp.from,
      catcherDirectory: catcher.directory,
    })
  }
}
