// The sketch routes over HTTP against the built app: create, load, save whole and as operations, retry,
// refuse stale and bad saves, draw images from the shapes, keep a bounded history and restore from it, and
// keep every user to their own sketches.

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

/** A signed-in user agent that saves whole drawings, operations, and the multipart form of older editors. */
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

  /** A whole-drawing save. */
  save(id: string, baseVersion: number, saveId: string, strokes: unknown[], view = { orientation: 'zenith-up', flip: 'mirrored' }) {
    return this.call('PUT', `/api/sketches/${id}`, { baseVersion, saveId, ...view, shapes: { ...emptyShapes(), strokes } })
  }

  /** An autosave of operations. */
  patch(id: string, baseVersion: number, saveId: string, steps: unknown[]) {
    return this.call('PATCH', `/api/sketches/${id}`, { baseVersion, saveId, steps })
  }

  /** The multipart save older editors sent, with their own image. */
  async legacySave(id: string, fields: Record<string, string>, raster: Uint8Array | null) {
    const form = new FormData()
    for (const [name, value] of Object.entries(fields)) form.set(name, value)
    if (raster) form.set('raster', new Blob([new Uint8Array(raster)], { type: 'image/png' }), 'sketch.png')
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

const pencil = (id: string, x: number) => ({ id, tool: 'pencil', tone: 1, size: 5, pen: true, points: [x, 900, 0.4, x + 40, 950, 0.6, x + 90, 990, 0.7] })
const add = (stroke: unknown) => ({ op: 'add', stroke })
const uuid = (n: number) => `6b1c9a64-2f57-4f55-9a3e-${String(n).padStart(12, '0')}`
const ids = (body: any) => body.shapes.strokes.map((s: any) => s.id)

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

/** Direct access to the test app's database, for what the API does not show (stored rows, the clock). */
function withDb<T>(work: (db: Database.Database) => T): T {
  const db = new Database(join(app.dataDir, 'shadowline.sqlite'))
  try {
    return work(db)
  }
  finally {
    db.close()
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

  it('saves a whole drawing as version 2 and loads it back; the image is drawn from the shapes when first asked for', async () => {
    const saved = await observer.save(id, 1, uuid(1), [pencil('a1', 800), pencil('a2', 1000)])
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ id, version: 2, hasRaster: true })
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body.version).toBe(2)
    expect(ids(loaded.body)).toEqual(['a1', 'a2'])
    expect(loaded.body.shapes.strokes[0].points).toEqual(pencil('a1', 800).points)
    // Nothing is drawn by the save itself.
    expect(storedKeys(`sketches/${id}`)).toEqual([])
  })

  it('serves the WebP image and its 256 and 512 px thumbnails, drawn once for the version', async () => {
    for (const [path, edge] of [[`/api/sketches/${id}/raster`, 2048], [`/api/sketches/${id}/thumbnail?size=512`, 512], [`/api/sketches/${id}/thumbnail`, 256]] as const) {
      const image = await observer.image(path)
      expect(image.status).toBe(200)
      expect(image.type).toBe('image/webp')
      const meta = await sharp(image.bytes).metadata()
      expect([meta.format, meta.width, meta.height]).toEqual(['webp', edge, edge])
    }
    expect(storedKeys(`sketches/${id}`).sort()).toEqual([`sketches/${id}/v2/full.webp`, `sketches/${id}/v2/thumb-256.webp`, `sketches/${id}/v2/thumb-512.webp`])
    expect((await observer.image(`/api/sketches/${id}/thumbnail?size=300`)).status).toBe(400)
  })

  it('applies operations: strokes added, a stroke taken away, the view turned, in order, as the next version', async () => {
    const saved = await observer.patch(id, 2, uuid(2), [add(pencil('a3', 600)), { op: 'remove', id: 'a1' }, add(pencil('a4', 1100))])
    expect(saved.status).toBe(200)
    expect(saved.body.version).toBe(3)
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(ids(loaded.body)).toEqual(['a2', 'a3', 'a4'])
    expect(loaded.body.shapes.strokes[1]).toEqual(pencil('a3', 600))

    const before = loaded.body.shapes.strokes[0].points
    const turned = await observer.patch(id, 3, uuid(3), [{ op: 'view', orientation: 'north-up', flip: 'mirrored' }, add(pencil('a5', 700))])
    expect(turned.body.version).toBe(4)
    const after = (await observer.call('GET', `/api/sketches/${id}`)).body
    expect(after.view).toEqual({ orientation: 'north-up', flip: 'mirrored' })
    // A turn about the disk's centre keeps each point's distance from it (geometry: a rotation), and the
    // stroke added after the turn is stored as sent.
    expect(after.shapes.strokes[0].points[0]).not.toBeCloseTo(before[0], 0)
    expect(Math.hypot(after.shapes.strokes[0].points[0] - 1024, after.shapes.strokes[0].points[1] - 1024))
      .toBeCloseTo(Math.hypot(before[0] - 1024, before[1] - 1024), 0)
    expect(after.shapes.strokes.at(-1)).toEqual(pencil('a5', 700))
  })

  it('lands a retried save once: the same id answers the version it made, with no second revision', async () => {
    const again = await observer.patch(id, 3, uuid(3), [{ op: 'view', orientation: 'north-up', flip: 'mirrored' }, add(pencil('a5', 700))])
    expect(again.status).toBe(200)
    expect(again.body.version).toBe(4)
    const loaded = (await observer.call('GET', `/api/sketches/${id}`)).body
    expect(loaded.version).toBe(4)
    expect(ids(loaded).filter((s: string) => s === 'a5')).toHaveLength(1)
    expect(withDb(db => db.prepare('select count(*) as n from sketch_revisions where sketch_id = ?').get(id))).toEqual({ n: 4 })
  })

  it('answers a stale base with 409 and the current version, and changes nothing', async () => {
    for (const stale of [
      await observer.patch(id, 2, uuid(4), [add(pencil('b1', 700))]),
      await observer.save(id, 3, uuid(5), [pencil('b1', 700)]),
    ]) {
      expect(stale.status).toBe(409)
      expect(stale.body.data).toMatchObject({ currentVersion: 4 })
    }
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body.version).toBe(4)
    expect(ids(loaded.body)).not.toContain('b1')
  })

  it('keeps the copy that lost the race as a whole-drawing save on the current version', async () => {
    const kept = await observer.save(id, 4, uuid(6), [pencil('b1', 700)], { orientation: 'zenith-up', flip: 'mirrored' })
    expect(kept.body.version).toBe(5)
    const loaded = (await observer.call('GET', `/api/sketches/${id}`)).body
    expect(ids(loaded)).toEqual(['b1'])
    expect(loaded.view).toEqual({ orientation: 'zenith-up', flip: 'mirrored' })
  })

  it('stores operations between checkpoints, and lists the checkpoints', async () => {
    const rows = withDb(db => db.prepare('select version, checkpoint, length(shapes) as whole, case when operations is null then 0 else 1 end as ops from sketch_revisions where sketch_id = ? order by version').all(id))
    expect(rows).toEqual([
      { version: 1, checkpoint: 'created', whole: expect.any(Number), ops: 0 },
      { version: 2, checkpoint: 'full', whole: expect.any(Number), ops: 0 },
      { version: 3, checkpoint: null, whole: 0, ops: 1 },
      { version: 4, checkpoint: null, whole: 0, ops: 1 },
      { version: 5, checkpoint: 'full', whole: expect.any(Number), ops: 0 },
    ])
    const revisions = await observer.call('GET', `/api/sketches/${id}/revisions`)
    expect(revisions.status).toBe(200)
    expect(revisions.body).toMatchObject({ version: 5, editable: true })
    expect(revisions.body.checkpoints.map((r: any) => [r.version, r.reason, r.strokes, r.createdBy])).toEqual([
      [5, 'full', 1, 'Idris Fenwright'], [2, 'full', 2, 'Idris Fenwright'], [1, 'created', 0, 'Idris Fenwright'],
    ])
  })

  it('keeps the drawing as a session left it when the next save comes after a long pause', async () => {
    // Half an hour passes (the stored clock is moved back rather than waiting).
    withDb(db => db.prepare('update sketches set updated_at = ? where id = ?').run(new Date(Date.now() - 31 * 60_000).toISOString(), id))
    const saved = await observer.patch(id, 5, uuid(7), [add(pencil('c1', 900))])
    expect(saved.body.version).toBe(6)
    await observer.patch(id, 6, uuid(8), [add(pencil('c2', 950))])
    withDb(db => db.prepare('update sketches set updated_at = ? where id = ?').run(new Date(Date.now() - 45 * 60_000).toISOString(), id))
    await observer.patch(id, 7, uuid(9), [add(pencil('c3', 1000))])
    const list = (await observer.call('GET', `/api/sketches/${id}/revisions`)).body.checkpoints
    // Version 5 was already whole; version 7 ended the second session.
    expect(list.map((r: any) => [r.version, r.reason, r.strokes])).toEqual([
      [7, 'session', 3], [5, 'full', 1], [2, 'full', 2], [1, 'created', 0],
    ])
  })

  it('draws any stored version from its checkpoint and the operations after it, and restores one as a new version', async () => {
    const thumb = await observer.image(`/api/sketches/${id}/revisions/4/thumbnail`)
    expect(thumb.status).toBe(200)
    expect((await sharp(thumb.bytes).metadata()).width).toBe(256)
    expect((await observer.image(`/api/sketches/${id}/revisions/99/thumbnail`)).status).toBe(404)

    const stale = await observer.call('POST', `/api/sketches/${id}/revisions/4/restore`, { baseVersion: 5, saveId: uuid(10) })
    expect(stale.status).toBe(409)
    const restored = await observer.call('POST', `/api/sketches/${id}/revisions/4/restore`, { baseVersion: 8, saveId: uuid(10) })
    expect(restored.status).toBe(200)
    expect(restored.body.version).toBe(9)
    const loaded = (await observer.call('GET', `/api/sketches/${id}`)).body
    // Version 4: a2, a3, a4 turned north-up, then a5; its view comes back with it.
    expect(ids(loaded)).toEqual(['a2', 'a3', 'a4', 'a5'])
    expect(loaded.view).toEqual({ orientation: 'north-up', flip: 'mirrored' })
    // The restore is itself a checkpoint, and the versions after 4 are all still there.
    const list = (await observer.call('GET', `/api/sketches/${id}/revisions`)).body.checkpoints
    expect(list[0]).toMatchObject({ version: 9, reason: 'restored', strokes: 4 })
    const again = await observer.call('POST', `/api/sketches/${id}/revisions/4/restore`, { baseVersion: 8, saveId: uuid(10) })
    expect(again.body.version).toBe(9)
    expect((await observer.call('POST', `/api/sketches/${id}/revisions/0/restore`, { baseVersion: 9, saveId: uuid(11) })).status).toBe(400)
  })

  it('lists the observer\'s sketches and gives the observation lists their summary', async () => {
    const list = await observer.call('GET', '/api/sketches')
    expect(list.status).toBe(200)
    expect(list.body.items.map((i: any) => i.id)).toContain(id)
    expect(list.body.items.find((i: any) => i.id === id)).toMatchObject({ version: 9, hasRaster: true, observation: { id: observationId } })
    const db = new Kysely<Schema>({ dialect: new SqliteDialect({ database: new Database(join(app.dataDir, 'shadowline.sqlite')) }) })
    try {
      const summary = await sketchesForObservations(db, [observationId, strangerObservationId])
      expect(summary.get(observationId)).toContainEqual({ id, status: 'draft', updatedAt: expect.any(String), hasRaster: true })
      expect(summary.get(strangerObservationId)).toEqual([])
    }
    finally {
      await db.destroy()
    }
  })
})

describe('submitting a sketch saved only as operations', () => {
  it('offers it for submission, keeps the submitted version whole, and draws its image for the review queue', async () => {
    const id = (await observer.call('POST', '/api/sketches', { observationId })).body.id
    expect((await observer.patch(id, 1, uuid(50), [add(pencil('s1', 800))])).status).toBe(200)
    expect(storedKeys(`sketches/${id}`)).toEqual([])
    const entries = await observer.call('GET', '/api/entries')
    expect(entries.body.find((e: any) => e.id === id)).toMatchObject({ hasRaster: true })
    const submitted = await observer.call('POST', `/api/entries/${id}/submit`, { comment: '' })
    expect(submitted.status).toBe(200)
    expect(storedKeys(`sketches/${id}`).sort()).toEqual([`sketches/${id}/v2/full.webp`, `sketches/${id}/v2/thumb-256.webp`, `sketches/${id}/v2/thumb-512.webp`])
    const list = (await observer.call('GET', `/api/sketches/${id}/revisions`)).body
    expect(list.checkpoints.map((r: any) => [r.version, r.reason, r.strokes])).toEqual([[2, 'submitted', 1], [1, 'created', 0]])
    expect(list.editable).toBe(false)
  })
})

describe('bad saves are refused and change nothing', () => {
  let id: string
  beforeAll(async () => {
    id = (await observer.call('POST', '/api/sketches', { observationId })).body.id
    expect((await observer.patch(id, 1, uuid(30), [add(pencil('k1', 800))])).body.version).toBe(2)
  })

  async function unchanged() {
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body.version).toBe(2)
    expect(ids(loaded.body)).toEqual(['k1'])
    expect(withDb(db => db.prepare('select count(*) as n from sketch_revisions where sketch_id = ?').get(id))).toEqual({ n: 2 })
  }

  it('refuses to take away a stroke that is not in the drawing with 400, writing nothing (not even the steps before it)', async () => {
    const answer = await observer.patch(id, 2, uuid(31), [add(pencil('k2', 900)), { op: 'remove', id: 'nowhere' }])
    expect(answer.status).toBe(400)
    expect(answer.body.message).toMatch(/stroke nowhere is not in the drawing/)
    await unchanged()
  })

  it('refuses a stroke id already in the drawing, a step it does not know and a stroke the schema rejects, with 400', async () => {
    expect((await observer.patch(id, 2, uuid(32), [add(pencil('k1', 900))])).body.message).toMatch(/already in the drawing/)
    expect((await observer.patch(id, 2, uuid(33), [{ op: 'smudge', id: 'k1' }])).status).toBe(400)
    const bad = await observer.patch(id, 2, uuid(34), [add({ ...pencil('k3', 800), tool: 'spray' })])
    expect(bad.status).toBe(400)
    expect(JSON.stringify(bad.body.data)).toMatch(/pencil, shade, eraser, fill/)
    expect((await observer.patch(id, 2, uuid(35), [])).status).toBe(400)
    expect((await observer.save(id, 2, uuid(36), [{ ...pencil('k3', 800), points: [1, 2] }])).status).toBe(400)
    await unchanged()
  })

  it('refuses a body that is neither JSON nor multipart with 415, broken JSON with 400, and one over the size limit with 413', async () => {
    const raw = (body: string, type: string) => fetch(`${app.url}/api/sketches/${id}`, { method: 'PATCH', headers: { 'cookie': observer.cookie, 'content-type': type }, body })
    expect((await raw('steps', 'text/plain')).status).toBe(415)
    expect((await raw('{"baseVersion": 2,', 'application/json')).status).toBe(400)
    // Sent in chunks with no declared length, so the server must count as it reads (and the answer is not
    // lost to a connection closed while a declared-too-large body is still being sent).
    const chunk = new TextEncoder().encode('1,'.repeat(512 * 1024))
    let sent = 0
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (sent === 0) controller.enqueue(new TextEncoder().encode(`{"baseVersion":2,"saveId":"${uuid(37)}","steps":[{"op":"add","stroke":{"id":"k4","tool":"pencil","tone":1,"size":5,"pen":true,"points":[`))
        if (sent > 26 * 1024 * 1024) controller.close()
        else controller.enqueue(chunk)
        sent += chunk.length
      },
    })
    const huge = await fetch(`${app.url}/api/sketches/${id}`, { method: 'PATCH', headers: { 'cookie': observer.cookie, 'content-type': 'application/json' }, body, duplex: 'half' } as RequestInit)
    expect(huge.status).toBe(413)
    await unchanged()
  })

  it('takes a multipart save from an older editor but never its image: the image is drawn from the shapes', async () => {
    // A bright square the drawing does not have: if it were stored, the image would show it.
    const forged = await sharp({ create: { width: SKETCH_SIZE, height: SKETCH_SIZE, channels: 3, background: { r: 255, g: 255, b: 255 } } }).png().toBuffer()
    const fields = { baseVersion: '2', saveId: uuid(38), orientation: 'zenith-up', flip: 'none', shapes: JSON.stringify({ ...emptyShapes(), strokes: [pencil('k1', 800)] }) }
    const saved = await observer.legacySave(id, fields, forged)
    expect(saved.status).toBe(200)
    expect(saved.body.version).toBe(3)
    const image = await observer.image(`/api/sketches/${id}/thumbnail`)
    const { data } = await sharp(image.bytes).greyscale().raw().toBuffer({ resolveWithObject: true })
    const mean = data.reduce((sum, v) => sum + v, 0) / data.length
    // One thin pencil stroke on black: the mean stays near black, far from the forged white (255).
    expect(mean).toBeLessThan(10)
  })

  it('refuses a save once the sketch has left draft (submitted)', async () => {
    withDb(db => db.prepare('update sketches set status = ? where id = ?').run('submitted', id))
    const answer = await observer.patch(id, 3, uuid(39), [add(pencil('k5', 800))])
    expect(answer.status).toBe(409)
    expect(answer.body.message).toMatch(/submitted/)
    expect((await observer.save(id, 3, uuid(40), [])).status).toBe(409)
    expect((await observer.call('POST', `/api/sketches/${id}/revisions/1/restore`, { baseVersion: 3, saveId: uuid(41) })).status).toBe(409)
    const loaded = await observer.call('GET', `/api/sketches/${id}`)
    expect(loaded.body).toMatchObject({ editable: false, version: 3 })
  })
})

describe('nobody sees or changes a sketch that is not theirs', () => {
  let id: string
  beforeAll(async () => {
    id = (await observer.call('POST', '/api/sketches', { observationId })).body.id
    expect((await observer.save(id, 1, uuid(20), [pencil('d1', 800)])).status).toBe(200)
  })

  it('hides another observer\'s draft: 404 on every sketch route', async () => {
    for (const path of [`/api/sketches/${id}`, `/api/sketches/${id}/revisions`, `/api/sketches/${id}/thumbnail`, `/api/sketches/${id}/raster`, `/api/sketches/${id}/revisions/1/thumbnail`]) {
      expect((await stranger.call('GET', path)).status, path).toBe(404)
    }
    expect((await stranger.save(id, 2, uuid(21), [pencil('x1', 800)])).status).toBe(404)
    expect((await stranger.patch(id, 2, uuid(23), [add(pencil('x1', 800))])).status).toBe(404)
    expect((await stranger.call('POST', `/api/sketches/${id}/revisions/1/restore`, { baseVersion: 2, saveId: uuid(24) })).status).toBe(404)
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
    expect((await moderator.call('GET', `/api/sketches/${id}/revisions`)).status).toBe(404)
    expect((await moderator.image(`/api/sketches/${id}/revisions/1/thumbnail`)).status).toBe(404)
    expect((await moderator.save(id, 2, uuid(22), [pencil('m1', 800)])).status).toBe(404)
    expect((await moderator.patch(id, 2, uuid(25), [add(pencil('m1', 800))])).status).toBe(404)
    expect((await moderator.call('POST', `/api/sketches/${id}/revisions/1/restore`, { baseVersion: 2, saveId: uuid(26) })).status).toBe(404)
    expect((await observer.call('GET', `/api/sketches/${id}`)).body.version).toBe(2)
  })

  it('keeps learners out (403) and signed-out visitors out (401)', async () => {
    expect((await learner.call('GET', `/api/sketches/${id}`)).status).toBe(403)
    expect((await new Agent(app.url).call('GET', `/api/sketches/${id}`)).status).toBe(401)
  })
})
