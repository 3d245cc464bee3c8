import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'

let app: RunningApp
let owner: Client
let other: Client
let siteId: string

const body = (change: Record<string, unknown> = {}) => ({
  siteId,
  localDate: '2026-11-18',
  localTime: '18:30',
  instrument: { kind: 'telescope', apertureMm: 114, focalLengthMm: 900, eyepieceMm: 25 },
  view: 'mirrored',
  seeing: 2,
  transparency: 4,
  notes: 'Copernicus rim bright on the terminator.',
  clinometerReadingDeg: 60,
  compassBearingDeg: 175,
  ...change,
})

async function count(client: Client) {
  return (await client.get('/api/observations?perPage=1')).body.total as number
}

async function upload(client: Client, file: Buffer, name: string, fields: Record<string, string>) {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) form.append(k, v)
  form.append('file', new Blob([new Uint8Array(file)]), name)
  const response = await fetch(`${app.url}/api/photos`, { method: 'POST', body: form, headers: { cookie: client.cookieHeader() } })
  return { status: response.status, body: await response.json().catch(() => null) }
}

beforeAll(async () => {
  app = await startApp()
  owner = new Client(app.url)
  await owner.signIn(DEMO.observer.email, DEMO.observer.password)
  other = new Client(app.url)
  await other.signIn(DEMO.moderator.email, DEMO.moderator.password)
  siteId = (await owner.get('/api/sites')).body[0].id
})
afterAll(async () => {
  await app?.stop()
})

describe('observations', () => {
  it('creates, reads, edits and deletes an observation, computing every predicted value', async () => {
    const created = await owner.post('/api/observations', body())
    expect(created.status).toBe(201)
    const o = created.body
    // 18:30 GMT at the site is 18:30 UTC in November.
    expect(o.observedAt).toBe('2026-11-18T18:30:00.000Z')
    expect(o.magnification).toBe(36)
    expect(o.altitude.derivedDeg).toBe(30)
    expect(o.altitude.residualDeg).toBeCloseTo(30 - o.circumstances.altitudeDeg, 10)
    expect(o.azimuth.residualDeg).toBeCloseTo(o.azimuth.derivedDeg - o.circumstances.azimuthDeg, 10)
    expect(o.circumstances.moon.rise).toMatch(/^2026-11-18T/)
    expect(o.computedWith).toMatch(/shadowline-lunar/)

    const read = await owner.get(`/api/observations/${o.id}`)
    expect(read.body.notes).toBe('Copernicus rim bright on the terminator.')

    const edited = await owner.request('PUT', `/api/observations/${o.id}`, body({ localTime: '19:30', compassBearingDeg: null }))
    expect(edited.status).toBe(200)
    expect(edited.body.observedAt).toBe('2026-11-18T19:30:00.000Z')
    expect(edited.body.azimuth).toBeNull()
    expect(edited.body.circumstances.azimuthDeg).not.toBeCloseTo(o.circumstances.azimuthDeg, 1)

    expect((await owner.request('DELETE', `/api/observations/${o.id}`)).status).toBe(204)
    expect((await owner.get(`/api/observations/${o.id}`)).status).toBe(404)
  })

  it('keeps each observer to their own: another cannot read, change, delete or export it', async () => {
    const o = (await owner.post('/api/observations', body())).body
    expect((await other.get(`/api/observations/${o.id}`)).status).toBe(404)
    expect((await other.request('PUT', `/api/observations/${o.id}`, body())).status).toBe(404)
    expect((await other.request('DELETE', `/api/observations/${o.id}`)).status).toBe(404)
    const csv = await other.get('/api/observations/export')
    expect(csv.body).not.toContain('Copernicus')
    // Nor log one at someone else's site.
    expect((await other.post('/api/observations', body())).status).toBe(400)
    expect((await owner.get(`/api/observations/${o.id}`)).status).toBe(200)
  })

  it.each([
    ['an unknown site', { siteId: '00000000-0000-4000-8000-000000000000' }, 'siteId'],
    ['a time beyond the supported years', { localDate: '2150-06-01' }, 'localDate'],
    ['seeing 7', { seeing: 7 }, 'seeing'],
    ['a negative aperture', { instrument: { kind: 'binoculars', magnification: 10, apertureMm: -50 } }, 'instrument.apertureMm'],
    ['a compass bearing outside the magnetic model', { localDate: '2019-06-01' }, 'compassBearingDeg'],
    ['a time the clocks skip', { localDate: '2026-03-29', localTime: '01:30' }, 'localTime'],
  ])('refuses %s with 400 and a message, storing nothing', async (_what, change, field) => {
    const before = await count(owner)
    const answer = await owner.post('/api/observations', body(change))
    expect(answer.status).toBe(400)
    expect(answer.body.message).toMatch(new RegExp(`^${field.replace('.', '\\.')}: `))
    expect(await count(owner)).toBe(before)
  })

  it('lists with filters, sorting and pages, and exports the same rows as CSV', async () => {
    const all = await owner.get('/api/observations?perPage=200&sort=observedAt&dir=asc')
    const times = all.body.items.map((i: { observedAt: string }) => i.observedAt)
    expect([...times].sort()).toEqual(times)
    const crescents = await owner.get('/api/observations?phase=waxing-crescent&perPage=200')
    expect(crescents.body.items.every((i: any) => i.circumstances.phaseName === 'waxing-crescent')).toBe(true)
    const page2 = await owner.get('/api/observations?perPage=2&page=2&sort=observedAt&dir=asc')
    expect(page2.body.items.map((i: any) => i.id)).toEqual(all.body.items.slice(2, 4).map((i: any) => i.id))
    const ranged = await owner.get('/api/observations?from=2026-11-16&to=2026-11-17&perPage=200')
    expect(ranged.body.items.every((i: any) => i.localDate >= '2026-11-16' && i.localDate <= '2026-11-17')).toBe(true)

    const csv = await owner.get('/api/observations/export?sort=observedAt&dir=asc')
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/)
    const lines = (csv.body as string).trim().split('\n')
    expect(lines[0]).toMatch(/^observed_at_utc,/)
    expect(lines.length).toBe(all.body.total + 1)
    expect((await owner.get('/api/observations?sort=brightness')).status).toBe(400)
  })

  it('builds the lunation worksheet with the compass offset of the demo series', async () => {
    const sheet = await owner.get('/api/worksheet?date=2026-11-18')
    expect(sheet.status).toBe(200)
    expect(sheet.body.nights.length).toBeGreaterThanOrEqual(30)
    // The demo compass was invented to read about 4° high.
    expect(sheet.body.compassOffset.offsetDeg).toBeGreaterThan(2.5)
    expect(sheet.body.compassOffset.offsetDeg).toBeLessThan(5.5)
    expect(sheet.body.notes[0]).toMatch(/azimuth falls/)
  })

  it('plans tonight only at the observer\'s own sites', async () => {
    expect((await owner.get(`/api/tonight?siteId=${siteId}&date=2026-11-16`)).status).toBe(200)
    expect((await other.get(`/api/tonight?siteId=${siteId}&date=2026-11-16`)).status).toBe(404)
    expect((await owner.get(`/api/tonight?siteId=${siteId}&date=16/11/2026`)).status).toBe(400)
  })
})

describe('sites', () => {
  it('looks up the time zone, keeps coordinates private and refuses bad input', async () => {
    const made = await owner.post('/api/sites', { name: 'Dune car park', latitude: -34.05, longitude: 18.35, elevation: 12 })
    expect(made.status).toBe(201)
    expect(made.body.timeZone).toBe('Africa/Johannesburg')
    expect((await other.get('/api/sites')).body.map((s: any) => s.id)).not.toContain(made.body.id)
    expect((await other.patch(`/api/sites/${made.body.id}`, { name: 'Mine now' })).status).toBe(404)
    expect((await owner.post('/api/sites', { name: 'Off the globe', latitude: 95, longitude: 0 })).status).toBe(400)
    expect((await owner.get('/api/sites/time-zone?latitude=52.6&longitude=-1.7')).body.timeZone).toBe('Europe/London')
    expect((await owner.request('DELETE', `/api/sites/${siteId}`)).status).toBe(409)
    expect((await owner.request('DELETE', `/api/sites/${made.body.id}`)).status).toBe(204)
  })
})

describe('photos', () => {
  it('stores a photo without its metadata, attached to the nearest observation, readable only by its owner', async () => {
    const jpeg = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#111' } })
      .jpeg().withExif({ IFD2: { DateTimeOriginal: '2026:11:16 18:50:00' } }).toBuffer()
    const answer = await upload(owner, jpeg, 'night-one.jpg', { siteId })
    expect(answer.status).toBe(201)
    expect(answer.body.takenAt).toBe('2026-11-16T18:50:00.000Z')
    expect(answer.body.takenAtSource).toBe('exif')
    const demoNight = (await owner.get('/api/observations?from=2026-11-16&to=2026-11-16')).body.items[0]
    expect(answer.body.observationId).toBe(demoNight.id)

    const image = await fetch(`${app.url}/api/photos/${answer.body.id}/image?size=full`, {
      headers: { cookie: owner.cookieHeader() },
    })
    expect(image.headers.get('content-type')).toBe('image/webp')
    expect((await sharp(Buffer.from(await image.arrayBuffer())).metadata()).exif).toBeUndefined()
    expect((await other.get(`/api/photos/${answer.body.id}/image`)).status).toBe(404)

    const moved = await owner.patch(`/api/photos/${answer.body.id}`, { localDate: '2026-11-17', localTime: '18:35' })
    expect(moved.body.takenAtSource).toBe('observer')
    expect(moved.body.observationId).not.toBe(demoNight.id)
  })

  it('refuses a 20 MB upload with 413 and a text file named .jpg with 415, storing nothing', async () => {
    const before = (await owner.get('/api/photos')).body.length
    const big = await upload(owner, Buffer.alloc(20 * 1024 * 1024, 7), 'huge.jpg', { siteId })
    expect(big.status).toBe(413)
    const text = await upload(owner, Buffer.from('clear skies, steady seeing'), 'notes.jpg', { siteId })
    expect(text.status).toBe(415)
    expect(text.body.message).toMatch(/not an image/)
    const jpeg = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#000' } }).jpeg().toBuffer()
    const badSite = await upload(owner, jpeg, 'moon.jpg', { siteId: 'my garden' })
    expect(badSite.status).toBe(400)
    expect(badSite.body.message).toMatch(/^siteId: /)
    const badTime = await upload(owner, jpeg, 'moon.jpg', { siteId, localDate: '2026-11-18', localTime: '25:61' })
    expect(badTime.status).toBe(400)
    expect((await owner.get('/api/photos')).body.length).toBe(before)
  })
})
