// Bad dates answer 400 and change nothing; deletion removes what it owned in the object store and keeps
// the features' pin counts true; a photo's pixels, not only its bytes, are limited; text searches treat
// % and _ as the characters they are.
import { readdirSync } from 'node:fs'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { savedSketch } from '../support/sketches'

let app: RunningApp
let owner: Client
let admin: Client
let siteId: string

/** Every object in the embedded S3 (s3rver keeps each as its bytes plus side files). */
function storedObjects(): string[] {
  const root = join(app.dataDir, 's3', 'shadowline')
  const walk = (dir: string): string[] => readdirSync(dir, { withFileTypes: true })
    .flatMap(e => (e.isDirectory() ? walk(join(dir, e.name)) : [join(dir, e.name)]))
  return walk(root).filter(f => f.endsWith('._S3rver_object')).map(f => f.slice(root.length + 1, -'._S3rver_object'.length))
}

async function upload(file: Buffer, fields: Record<string, string>) {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) form.append(k, v)
  form.append('file', new Blob([new Uint8Array(file)]), 'moon.png')
  const response = await fetch(`${app.url}/api/photos`, { method: 'POST', body: form, headers: { cookie: owner.cookieHeader() } })
  return { status: response.status, body: await response.json().catch(() => null) }
}

const smallPhoto = () => sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 20, g: 20, b: 30 } } }).png().toBuffer()

function query<T>(sql: string, ...params: unknown[]): T[] {
  const db = new Database(join(app.dataDir, 'shadowline.sqlite'))
  try {
    return db.prepare(sql).all(...params) as T[]
  }
  finally {
    db.close()
  }
}

beforeAll(async () => {
  app = await startApp()
  owner = new Client(app.url)
  await owner.signIn(DEMO.observer.email, DEMO.observer.password)
  admin = new Client(app.url)
  await admin.signIn(DEMO.admin.email, DEMO.admin.password)
  siteId = (await owner.get('/api/sites')).body[0].id
})
afterAll(async () => {
  await app?.stop()
})

describe('dates that do not exist, or lie outside 1900–2100', () => {
  it('answers 400 for 30 February on the worksheet and tonight', async () => {
    const worksheet = await owner.get('/api/worksheet?date=2026-02-30')
    expect(worksheet.status).toBe(400)
    expect(JSON.stringify(worksheet.body.data)).toMatch(/does not exist/)
    expect((await owner.get(`/api/tonight?siteId=${siteId}&date=2026-02-30`)).status).toBe(400)
    // 2028 is a leap year (Gregorian rule, common practice): 29 February exists.
    expect((await owner.get(`/api/tonight?siteId=${siteId}&date=2028-02-29`)).status).toBe(200)
  })

  it('refuses a photo dated 9999-12-31 with 400 and writes no object', async () => {
    const before = storedObjects().length
    const answer = await upload(await smallPhoto(), { siteId, localDate: '9999-12-31', localTime: '21:00' })
    expect(answer.status).toBe(400)
    expect(storedObjects().length).toBe(before)
  })

  it('refuses to re-time a photo to 9999-12-31 or to year 99, and keeps its time', async () => {
    const photo = await upload(await smallPhoto(), { siteId, localDate: '2026-11-20', localTime: '19:00' })
    expect(photo.status).toBe(201)
    for (const localDate of ['9999-12-31', '0099-11-20']) {
      expect((await owner.patch(`/api/photos/${photo.body.id}`, { localDate, localTime: '19:00' })).status).toBe(400)
    }
    const kept = (await owner.get('/api/photos')).body.find((p: any) => p.id === photo.body.id)
    expect(kept.takenAt).toBe(photo.body.takenAt)
  })

  it('refuses an observation in year 99 rather than storing it as 1999', async () => {
    const answer = await owner.post('/api/observations', {
      siteId, localDate: '0099-11-18', localTime: '18:30', instrument: { kind: 'naked-eye' }, view: 'upright', notes: '',
    })
    expect(answer.status).toBe(400)
    expect(JSON.stringify(answer.body.data)).toMatch(/1900 to 2100/)
  })
})

describe('deletion leaves nothing behind', () => {
  it('removes an observation\'s sketches and photos from storage and keeps pin counts true', async () => {
    const created = await owner.post('/api/observations', {
      siteId, localDate: '2026-11-25', localTime: '19:10', instrument: { kind: 'naked-eye' }, view: 'upright', notes: 'To be deleted.',
    })
    expect(created.status).toBe(201)
    const observationId = created.body.id
    const sketchId = await savedSketch(app.url, owner, observationId)
    expect((await owner.post(`/api/sketches/${sketchId}/tags`, { x: 0.05, y: 0.1, name: 'Shortlived Rille' })).status).toBe(201)
    const crater = (await owner.get('/api/features?perPage=100&status=confirmed')).body.items[0]
    expect((await owner.post(`/api/sketches/${sketchId}/tags`, { x: -0.1, y: 0.05, featureId: crater.id })).status).toBe(201)
    const photo = await upload(await smallPhoto(), { siteId, localDate: '2026-11-25', localTime: '19:20' })
    expect(photo.body.observationId).toBe(observationId)

    // Saves draw no image; the first read draws and stores it, so there is something to remove.
    expect((await owner.get(`/api/sketches/${sketchId}/thumbnail`)).status).toBe(200)
    const objectsWith = storedObjects()
    expect(objectsWith.filter(k => k.startsWith(`sketches/${sketchId}/`)).length).toBeGreaterThan(0)
    expect(objectsWith.filter(k => k.includes(photo.body.id)).length).toBe(2)

    expect((await owner.request('DELETE', `/api/observations/${observationId}`)).status).toBe(204)
    const after = storedObjects()
    expect(after.filter(k => k.startsWith(`sketches/${sketchId}/`) || k.includes(photo.body.id))).toEqual([])
    expect(after.length).toBe(objectsWith.length - objectsWith.filter(k => k.startsWith(`sketches/${sketchId}/`) || k.includes(photo.body.id)).length)

    // Every feature's count equals a recount of its pins.
    const counts = query<{ id: string, pin_count: number, pins: number }>(
      'select f.id, f.pin_count, (select count(*) from feature_tags t where t.feature_id = f.id) as pins from features f',
    )
    for (const row of counts) expect(Number(row.pin_count), row.id).toBe(Number(row.pins))
    const confirmed = (await owner.get(`/api/features/${crater.id}`)).body.feature
    expect(confirmed.pinCount).toBe(crater.pinCount)
  })

  it('removes the observation a photo started when the photo is re-timed away from it', async () => {
    const photo = await upload(await smallPhoto(), { siteId, localDate: '2026-10-02', localTime: '03:15' })
    expect(photo.status).toBe(201)
    const started = photo.body.observationId
    expect((await owner.get(`/api/observations/${started}`)).status).toBe(200)
    const moved = await owner.patch(`/api/photos/${photo.body.id}`, { localDate: '2026-10-09', localTime: '03:15' })
    expect(moved.status).toBe(200)
    expect(moved.body.observationId).not.toBe(started)
    expect((await owner.get(`/api/observations/${started}`)).status).toBe(404)
    // And deleting the photo removes the one its new time started.
    expect((await owner.request('DELETE', `/api/photos/${photo.body.id}`)).status).toBe(204)
    expect((await owner.get(`/api/observations/${moved.body.observationId}`)).status).toBe(404)
  })
})

describe('photo size in pixels', () => {
  it('refuses a small file that claims too many pixels with 413, before decoding it', async () => {
    // 9000 × 9000 = 81 megapixels of one flat colour: far below the 15 MB byte limit, so only a pixel cap stops it.
    const bomb = await sharp({ create: { width: 9000, height: 9000, channels: 3, background: { r: 0, g: 0, b: 0 } } }).png({ compressionLevel: 9 }).toBuffer()
    expect(bomb.length).toBeLessThan(1_000_000)
    const before = storedObjects().length
    const answer = await upload(bomb, { siteId })
    expect(answer.status).toBe(413)
    expect(answer.body.message).toMatch(/megapixels/)
    expect(storedObjects().length).toBe(before)
  })
})

describe('searches with % and _ in the text', () => {
  it('finds an account whose name has an underscore or a percent sign, and only it', async () => {
    for (const name of ['ray_crater', 'rayXcrater', '100% moon', '100 moons']) {
      const email = `${name.replace(/\W/g, '')}@example.test`
      expect((await new Client(app.url).post('/api/auth/sign-up', { name, email, password: 'a-long-enough-secret' })).status).toBe(202)
    }
    const underscore = await admin.get(`/api/admin/users?q=${encodeURIComponent('ray_c')}`)
    expect(underscore.body.items.map((u: any) => u.name)).toEqual(['ray_crater'])
    const percent = await admin.get(`/api/admin/users?q=${encodeURIComponent('100%')}`)
    expect(percent.body.items.map((u: any) => u.name)).toEqual(['100% moon'])
  })

  it('finds an entry in the review queue by an observer name with an underscore', async () => {
    const demoObserver = (await admin.get('/api/admin/users?q=observer%40')).body.items[0]
    const plain = await admin.get(`/api/review/queue?observer=${encodeURIComponent(demoObserver.name.slice(0, 4))}`)
    expect(plain.body.total).toBeGreaterThan(0)
    const wildcard = await admin.get(`/api/review/queue?observer=${encodeURIComponent(`${demoObserver.name.slice(0, 2)}_`)}`)
    expect(wildcard.body.total).toBe(0)
  })
})
