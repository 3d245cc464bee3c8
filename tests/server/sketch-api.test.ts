// The sketch routes over HTTP against the built app: create, load, save with a raster, revise, refuse stale
// and bad saves, and keep every user to their own sketches.

import { readdirSync } from 'node:fs'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { Kysely, SqliteDialect } from 'kysely'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Database as Schema } from '../../db/schema'
import { sketchesForObservations } from '../../server/utils/sketches'
import { SKETCH_SIZE } from '../../shared/sketch/frame'
import { emptyShapes } from '../../shared/sketch/schema'
import { DEMO, linkIn, startApp, waitForMail, type RunningApp } from '../support/app'
import { insertObservation, insertSite } from '../support/observations'

/** A signed-in user agent that also sends multipart saves. */
class Agent {
  cookie = ''
  constructor(private readonly base: string) {}

  async call(method: string, path: string, body?: unknown) {
    const response = await fetch(this.base + path, {
      method,
      headers: { accept: 'application/json', cookie: this.cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
    const setCookie = response.headers.getSetCookie()[0]
    if (setCookie) this.cookie = setCookie.split(';')[0]!
    const text = await response.text()
    let parsed: any = text
    try {
      parsed = JSON.parse(text)
    }
    catch { /* not JSON */ }
    return { status: response.status, body: parsed, headers: response.headers }
  }

  async signIn(email: string, password: string) {
    const answer = await this.call('POST', '/api/auth/sign-in', { email, password })
    expect(answer.status).toBe(200)
    return this
  }

  async save(id: string, fields: Record<string, string>, raster: Uint8Array | null, contentType = 'image/png') {
    const form = new FormData()
    for (const [name, value] of Object.entries(fields)) form.set(name, value)
    if (raster) form.set('raster', new Blob([new Uint8Array(raster)], { type: contentType }), 'sketch.png')
    const response = await fetch(`${this.base}/api/sketches/${id}`, { method: 'PUT', headers: { cookie: this.cookie, accept: 'application/json' }, body: form })
    return { status: response.status, body: await response.json().catch(() => null) as any }
  }

  async image(path: string) {
    const response = await fetch(this.base + path, { headers: { cookie: this.cookie } })
    return { status: response.status, type: response.headers.get('content-type'), bytes: Buffer.from(await response.arrayBuffer()) }
  }
}

let app: RunningApp
let observer: Agent
let moderator: Agent
let stranger: Agent
let learner: Agent
let observationId: string
let strangerObservationId: string

const raster = (shade = 200) => sharp({ create: { width: SKETCH_SIZE, height: SKETCH_SIZE, channels: 3, background: { r: 0, g: 0, b: 0 } } })
  .composite([{ input: Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="${SKETCH_SIZE}" height="${SKETCH_SIZE}"><circle cx="1024" cy="1024" r="860" fill="rgb(${shade},${shade},${shade})"/></svg>`) }])
  .png()
  .toBuffer()

const pencil = (id: string, x: number) => ({ id, tool: 'pencil', tone: 1, size: 5, pen: true, points: [x, 900, 0.4, x + 40, 950, 0.6, x + 90, 990, 0.7] })
const shapesWith = (...strokes: unknown[]) => JSON.stringify({ ...emptyShapes(), strokes })
const fields = (baseVersion: number, saveId: string, strokes: unknown[], view = { orientation: 'zenith-up', flip: 'mirrored' }) => ({
  baseVersion: String(baseVersion), saveId, ...view, shapes: shapesWith(...strokes),
})
const uuid = (n: number) => `6b1c9a64-2f57-4f55-9a3e-${String(n).padStart(12, '0')}`

/** Every object key the embedded S3 holds under a prefix. */
function storedKeys(prefix: string): string[] {
  const root = join(app.dataDir, 's3', 'shadowline')
  const walk = (dir: string): string[] => readdirSync(dir, { withFileTypes: true }).flatMap(e => (e.isDirectory() ? walk(join(dir, e.name)) : [join(dir, e.name)]))
  try {
    // s3rver keeps each object as its bytes plus side files (metadata, checksum).
    return walk(join(root, prefix))
      .filter(file => file.endsWith('._S3rver_object'))
      .map(file => file.slice(root.length + 1, -'._S3rver_object'.length))
  }
  catch {
    return []
  }
}

beforeAll(async () => {
  app = await startApp()
  observer = await new Agent(app.url).signIn(DEMO.observer.email, DEMO.observer.password)
  moderator = await new Agent(app.url).signIn(DEMO.moderator.email, DEMO.moderator.password)
  learner = await new Agent(app.url).signIn(DEMO.learner.email, DEMO.learner.password)

  // A second observer, confirmed the way a newcomer is.
  stranger = new Agent(app.url)
  const email = 'wren.halloway@example.test'
  expect((await stranger.call('POST', '/api/auth/sign-up', { name: 'Wren Halloway', email, password: 'a-long-quiet-night' })).status).toBeLessThan(300)
  const mail = await waitForMail(app.dataDir, email, /Confirm your Shadowline/)
  const token = new URL(linkIn(mail.text, '/verify-email')).searchParams.get('token')
  expect((await stranger.call('POST', '/api/auth/verify-email', { token })).status).toBe(200)
  await stranger.signIn(email, 'a-long-quiet-night')
  insertSite(app.dataDir, email, { name: 'Wren rooftop', latitude: 52.6, longitude: -1.7, elevation: 90, timeZone: 'Europe/London' })

  observationId = insertObservation(app.dataDir, { email: DEMO.observer.email, observedAt: '2026-02-23T19:00:00Z', view: 'mirrored' })
  strangerObservationId = insertObservation(app.dataDir, { email, observedAt: '2026-02-23T19:10:00Z' })
})
afterAll(async () => {
  await app?.stop()
})

describe('a sketch from start to revisions', () => {
  let id: string

  it('starts a sketch of the observer\'s own observation, empty, in the sky view with the instrument\'s flip', async () => {
    const created = await observer.call('POST', '/api/sketches', { observationId })
    expect(created.status).toBe(201)
    id = created.body.id
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.status).toBe(200)
    expect(loaded.body).toMatchObject({
      id,
      status: 'draft',
      version: 1,
      editable: true,
      hasRaster: false,
      view: { orientation: 'zenith-up', flip: 'mirrored' },
      shapes: { schemaVersion: 1, strokes: [] },
      observation: {
        id: observationId,
        observedAt: '2026-02-23T19:00:00.000Z',
        timeZone: 'Europe/London',
        view: 'mirrored',
        site: { name: 'Brackenfield school playing field', latitude: 52.634, longitude: -1.692, elevation: 95 },
      },
    })
  })

  it('saves strokes with a raster as version 2, and loads them back', async () => {
    const saved = await observer.save(id, fields(1, uuid(1), [pencil('a1', 800), pencil('a2', 1000)]), await raster())
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ id, version: 2, hasRaster: true })
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body.version).toBe(2)
    expect(loaded.body.shapes.strokes.map((s: any) => s.id)).toEqual(['a1', 'a2'])
    expect(loaded.body.shapes.strokes[0].points).toEqual(pencil('a1', 800).points)
  })

  it('serves the WebP image and its 256 and 512 px thumbnails', async () => {
    for (const [path, edge] of [[`/api/sketches/${id}/raster`, 2048], [`/api/sketches/${id}/thumbnail?size=512`, 512], [`/api/sketches/${id}/thumbnail`, 256]] as const) {
      const image = await observer.image(path)
      expect(image.status).toBe(200)
      expect(image.type).toBe('image/webp')
      const meta = await sharp(image.bytes).metadata()
      expect([meta.format, meta.width, meta.height]).toEqual(['webp', edge, edge])
    }
    expect((await observer.image(`/api/sketches/${id}/thumbnail?size=300`)).status).toBe(400)
  })

  it('revises: a save on the latest version makes the next, and every version stays in the history', async () => {
    const saved = await observer.save(id, fields(2, uuid(2), [pencil('a1', 800)], { orientation: 'north-up', flip: 'mirrored' }), await raster(120))
    expect(saved.body.version).toBe(3)
    const revisions = await observer.call('GET', `/api/sketches/${id}/revisions`)
    expect(revisions.status).toBe(200)
    expect(revisions.body.map((r: any) => [r.version, r.hasRaster, r.createdBy])).toEqual([
      [3, true, 'Idris Fenwright'], [2, true, 'Idris Fenwright'], [1, false, 'Idris Fenwright'],
    ])
    expect(revisions.body[0].view).toEqual({ orientation: 'north-up', flip: 'mirrored' })
    // Each save wrote its own images; the first save's are still there.
    expect(storedKeys(`sketches/${id}/${uuid(1)}`)).toHaveLength(3)
    expect(storedKeys(`sketches/${id}/${uuid(2)}`)).toHaveLength(3)
  })

  it('answers a stale save with 409 and the current version, and changes nothing', async () => {
    const stale = await observer.save(id, fields(2, uuid(3), [pencil('b1', 700)]), await raster())
    expect(stale.status).toBe(409)
    expect(stale.body.data).toMatchObject({ currentVersion: 3 })
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body.version).toBe(3)
    expect(loaded.body.shapes.strokes.map((s: any) => s.id)).toEqual(['a1'])
    expect(storedKeys(`sketches/${id}/${uuid(3)}`)).toEqual([])
  })

  it('recognises a retried save that had landed, without a second revision', async () => {
    const again = await observer.save(id, fields(2, uuid(2), [pencil('a1', 800)]), await raster(120))
    expect(again.status).toBe(200)
    expect(again.body.version).toBe(3)
    expect((await observer.call('GET', `/api/sketches/${id}/revisions`)).body).toHaveLength(3)
  })

  it('keeps the copy that lost the race as a new revision when saved on the current version', async () => {
    const kept = await observer.save(id, fields(3, uuid(4), [pencil('b1', 700)]), await raster())
    expect(kept.body.version).toBe(4)
    expect((await observer.call('GET', `/api/sketches/${id}`)).body.shapes.strokes.map((s: any) => s.id)).toEqual(['b1'])
  })

  it('lists the observer\'s sketches and gives the observation lists their summary', async () => {
    const list = await observer.call('GET', '/api/sketches')
    expect(list.status).toBe(200)
    expect(list.body.items.map((i: any) => i.id)).toContain(id)
    expect(list.body.items.find((i: any) => i.id === id)).toMatchObject({ version: 4, hasRaster: true, observation: { id: observationId } })
    const db = new Kysely<Schema>({ dialect: new SqliteDialect({ database: new Database(join(app.dataDir, 'shadowline.sqlite')) }) })
    try {
      const summary = await sketchesForObservations(db, [observationId, strangerObservationId])
      expect(summary.get(observationId)).toEqual([{ id, status: 'draft', updatedAt: expect.any(String), hasRaster: true }])
      expect(summary.get(strangerObservationId)).toEqual([])
    }
    finally {
      await db.destroy()
    }
  })
})

describe('bad saves are refused and change nothing', () => {
  let id: string
  beforeAll(async () => {
    id = (await observer.call('POST', '/api/sketches', { observationId })).body.id
  })

  async function unchanged() {
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body.version).toBe(1)
    expect(loaded.body.hasRaster).toBe(false)
    expect(storedKeys(`sketches/${id}`)).toEqual([])
  }

  it('refuses a JPEG raster with 415', async () => {
    const jpeg = await sharp(await raster()).jpeg().toBuffer()
    expect((await observer.save(id, fields(1, uuid(10), [pencil('c1', 800)]), jpeg, 'image/png')).status).toBe(415)
    await unchanged()
  })

  it('refuses a raster of the wrong size with 422', async () => {
    const small = await sharp(await raster()).resize(1024, 1024).png().toBuffer()
    const answer = await observer.save(id, fields(1, uuid(11), [pencil('c1', 800)]), small)
    expect(answer.status).toBe(422)
    expect(answer.body.message).toMatch(/2048 × 2048/)
    await unchanged()
  })

  it('refuses a save without a raster, and a drawing the schema rejects, with 400', async () => {
    expect((await observer.save(id, fields(1, uuid(12), [pencil('c1', 800)]), null)).status).toBe(400)
    const bad = await observer.save(id, fields(1, uuid(13), [{ ...pencil('c1', 800), tool: 'spray' }]), await raster())
    expect(bad.status).toBe(400)
    expect(JSON.stringify(bad.body.data)).toMatch(/pencil, shade, eraser, fill/)
    await unchanged()
  })

  it('refuses a body that is not multipart with 415, and one over the size limit with 413', async () => {
    expect((await observer.call('PUT', `/api/sketches/${id}`, { baseVersion: 1 })).status).toBe(415)
    const huge = await observer.save(id, fields(1, uuid(14), [pencil('c1', 800)]), new Uint8Array(25 * 1024 * 1024))
    expect(huge.status).toBe(413)
    await unchanged()
  })

  it('refuses a save once the sketch has left draft (submitted)', async () => {
    const db = new Database(join(app.dataDir, 'shadowline.sqlite'))
    db.prepare('update sketches set status = ? where id = ?').run('submitted', id)
    db.close()
    const answer = await observer.save(id, fields(1, uuid(15), [pencil('c1', 800)]), await raster())
    expect(answer.status).toBe(409)
    expect(answer.body.message).toMatch(/submitted/)
    expect((await observer.call('GET', `/api/sketches/${id}`)).body.editable).toBe(false)
    await unchanged()
  })
})

describe('nobody sees or changes a sketch that is not theirs', () => {
  let id: string
  beforeAll(async () => {
    id = (await observer.call('POST', '/api/sketches', { observationId })).body.id
    expect((await observer.save(id, fields(1, uuid(20), [pencil('d1', 800)]), await raster())).status).toBe(200)
  })

  it('hides another observer\'s draft: 404 on every sketch route', async () => {
    for (const path of [`/api/sketches/${id}`, `/api/sketches/${id}/revisions`, `/api/sketches/${id}/thumbnail`, `/api/sketches/${id}/raster`]) {
      expect((await stranger.call('GET', path)).status, path).toBe(404)
    }
    expect((await stranger.save(id, fields(2, uuid(21), [pencil('x1', 800)]), await raster())).status).toBe(404)
    expect((await stranger.call('GET', '/api/sketches')).body.items).toEqual([])
  })

  it('will not start a sketch of someone else\'s observation (404), nor of an unknown one', async () => {
    expect((await stranger.call('POST', '/api/sketches', { observationId })).status).toBe(404)
    expect((await observer.call('POST', '/api/sketches', { observationId: strangerObservationId })).status).toBe(404)
    expect((await observer.call('POST', '/api/sketches', { observationId: uuid(99) })).status).toBe(404)
    expect((await observer.call('POST', '/api/sketches', { observationId: 'not-an-id' })).status).toBe(400)
  })

  it('keeps the draft from a moderator too: it is its owner\'s alone', async () => {
    expect((await moderator.call('GET', `/api/sketches/${id}`)).status).toBe(404)
    expect((await moderator.image(`/api/sketches/${id}/thumbnail`)).status).toBe(404)
    expect((await moderator.save(id, fields(2, uuid(22), [pencil('m1', 800)]), await raster())).status).toBe(404)
    expect((await observer.call('GET', `/api/sketches/${id}`)).body.version).toBe(2)
  })

  it('keeps learners out (403) and signed-out visitors out (401)', async () => {
    expect((await learner.call('GET', `/api/sketches/${id}`)).status).toBe(403)
    expect((await new Agent(app.url).call('GET', `/api/sketches/${id}`)).status).toBe(401)
  })
})
