// The entry lifecycle and the public atlas over HTTP: every transition allowed and refused by role and
// state, the queue, concurrent decisions, the decision e-mails, and what the atlas never reveals.

import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, caughtMail, startApp, type RunningApp } from '../support/app'
import { savedSketch as savedSketchOf } from '../support/sketches'

let app: RunningApp
let observer: Client
let moderator: Client
let admin: Client
let learner: Client
let otherObserver: Client
let observations: { id: string, localDate: string }[]

const savedSketch = (observationId: string) => savedSketchOf(app.url, observer, observationId)

const decide = (client: Client, id: string, decision: string, comment = '') => client.post(`/api/entries/${id}/decision`, { decision, comment })

beforeAll(async () => {
  app = await startApp()
  observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
  moderator = new Client(app.url)
  await moderator.signIn(DEMO.moderator.email, DEMO.moderator.password)
  admin = new Client(app.url)
  await admin.signIn(DEMO.admin.email, DEMO.admin.password)
  learner = new Client(app.url)
  await learner.signIn(DEMO.learner.email, DEMO.learner.password)
  otherObserver = new Client(app.url)
  await otherObserver.post('/api/auth/sign-up', { name: 'Pell Arden', email: 'pell@example.test', password: 'pell-long-password' })
  await otherObserver.signIn('pell@example.test', 'pell-long-password')
  // Confirmed by an administrator instead of by mail, to keep this file on its subject.
  const pell = (await admin.get('/api/admin/users?q=pell')).body.items[0].id
  await admin.patch(`/api/admin/users/${pell}`, { role: 'observer' })
  observations = (await observer.get('/api/observations?perPage=50&sort=observedAt&dir=asc')).body.items
})
afterAll(async () => {
  await app?.stop()
})

describe('the entry lifecycle', () => {
  it('goes draft → submitted → returned → submitted → approved, recording every step and mailing each decision', async () => {
    const id = await savedSketch(observations[0]!.id)
    expect((await observer.post(`/api/entries/${id}/submit`)).body.status).toBe('submitted')
    expect((await decide(moderator, id, 'return', '')).status).toBe(400)
    expect((await decide(moderator, id, 'return', 'Mark where the terminator crosses the craters you saw.')).body.status).toBe('returned')
    expect((await observer.post(`/api/entries/${id}/submit`)).body.status).toBe('submitted')
    expect((await decide(moderator, id, 'approve', 'Lovely shading.')).body.status).toBe('approved')

    const history = (await observer.get(`/api/entries/${id}/history`)).body
    expect(history.map((h: any) => `${h.from}>${h.to}`)).toEqual(['draft>submitted', 'submitted>returned', 'returned>submitted', 'submitted>approved'])
    expect(history[1]).toMatchObject({ by: 'Bram Toller', comment: 'Mark where the terminator crosses the craters you saw.' })

    const mine = (await observer.get('/api/entries')).body.find((e: any) => e.id === id)
    expect(mine.status).toBe('approved')
    expect(mine.comments.map((c: any) => c.comment)).toContain('Mark where the terminator crosses the craters you saw.')

    const deadline = Date.now() + 15_000
    let subjects: string[] = []
    while (Date.now() < deadline) {
      subjects = (await caughtMail(app.dataDir)).filter(m => m.to.includes(DEMO.observer.email)).map(m => m.subject)
      if (subjects.includes('Your sketch is in the atlas') && subjects.includes('Your sketch was returned with comments')) break
      await new Promise(r => setTimeout(r, 100))
    }
    expect(subjects).toContain('Your sketch was returned with comments')
    expect(subjects).toContain('Your sketch is in the atlas')
    // The approval links to the published atlas page, which opens for anyone.
    const approval = (await caughtMail(app.dataDir)).find(m => m.to.includes(DEMO.observer.email) && m.subject === 'Your sketch is in the atlas')!
    const link = /See it in the atlas: (\S+)/.exec(approval.text)?.[1]
    expect(link).toMatch(new RegExp(`/atlas/${id}$`))
    expect((await new Client(app.url).get(new URL(link!).pathname.replace('/atlas/', '/api/atlas/'))).status).toBe(200)
  })

  it('refuses transitions by the wrong role, the wrong person or from the wrong state', async () => {
    const id = await savedSketch(observations[1]!.id)
    // Drafts are private: a moderator cannot see one, let alone decide on it.
    expect((await decide(moderator, id, 'approve')).status).toBe(404)
    expect((await otherObserver.post(`/api/entries/${id}/submit`)).status).toBe(404)
    expect((await learner.post(`/api/entries/${id}/submit`)).status).toBe(403)
    expect((await observer.post(`/api/entries/${id}/decision`, { decision: 'approve' })).status).toBe(403)
    await observer.post(`/api/entries/${id}/submit`)
    expect((await observer.post(`/api/entries/${id}/submit`)).status).toBe(409)
    // The observation a moderator is judging the sketch against cannot change under them, nor vanish.
    const o = observations[1]! as any
    const edit = await observer.request('PUT', `/api/observations/${o.id}`, {
      siteId: o.site.id, localDate: o.localDate, localTime: '21:00', instrument: { kind: 'naked-eye' }, view: 'upright',
    })
    expect(edit.status).toBe(409)
    expect((await observer.request('DELETE', `/api/observations/${o.id}`)).status).toBe(409)
    expect((await decide(moderator, id, 'withdraw', 'no reason')).status).toBe(409)
    expect((await decide(moderator, id, 'publish')).status).toBe(400)
    await decide(moderator, id, 'approve')
    expect((await decide(moderator, id, 'withdraw', '')).status).toBe(400)
    expect((await decide(moderator, id, 'withdraw', 'The date does not match the phase drawn.')).body.status).toBe('withdrawn')
    expect((await decide(moderator, id, 'approve')).status).toBe(409)
    // A withdrawn entry may be improved and submitted again by its observer.
    expect((await observer.post(`/api/entries/${id}/submit`)).body.status).toBe('submitted')
  })

  it('keeps a moderator from approving their own entry', async () => {
    const ownObs = await moderator.post('/api/observations', {
      siteId: (await moderator.get('/api/sites')).body[0].id,
      localDate: '2026-11-20',
      localTime: '19:00',
      instrument: { kind: 'naked-eye' },
      view: 'upright',
    })
    const created = { body: { id: await savedSketchOf(app.url, moderator, ownObs.body.id) } }
    expect((await moderator.post(`/api/entries/${created.body.id}/submit`)).status).toBe(200)
    const own = await decide(moderator, created.body.id, 'approve')
    expect(own.status).toBe(403)
    expect(own.body.message).toMatch(/Another moderator/)
    expect((await decide(admin, created.body.id, 'approve')).status).toBe(200)
  })

  it('gives the second of two simultaneous decisions 409 with the first decision', async () => {
    const id = await savedSketch(observations[2]!.id)
    await observer.post(`/api/entries/${id}/submit`)
    const [a, b] = await Promise.all([
      decide(moderator, id, 'approve', 'Clear and careful.'),
      decide(admin, id, 'return', 'Please add the time.'),
    ])
    const statuses = [a.status, b.status].sort()
    expect(statuses).toEqual([200, 409])
    const loser = a.status === 409 ? a : b
    const winner = a.status === 200 ? a : b
    expect(loser.body.data.status).toBe(winner.body.status)
    expect(loser.body.data.current.status).toBe(winner.body.status)
    expect((await observer.get(`/api/entries/${id}/history`)).body).toHaveLength(2)
  })
})

describe('the review queue', () => {
  it('shows submitted entries only, to moderators only', async () => {
    const queue = (await moderator.get('/api/review/queue?perPage=100')).body
    const statuses = await Promise.all(queue.items.map(async (row: any) => (await moderator.get(`/api/review/${row.id}`)).body.sketch.status))
    expect(statuses.length).toBeGreaterThan(0)
    expect(statuses.every(s => s === 'submitted')).toBe(true)
    expect((await observer.get('/api/review/queue')).status).toBe(403)
    const filtered = (await moderator.get('/api/review/queue?phase=full')).body
    expect(filtered.items.every((row: any) => row.phaseName === 'full')).toBe(true)
  })
})

describe('the atlas', () => {
  it('is public, lists only approved entries, and never shows e-mail addresses or precise coordinates', async () => {
    const visitor = new Client(app.url)
    const atlas = await visitor.get('/api/atlas?perPage=60')
    expect(atlas.status).toBe(200)
    const approvedIds = new Set<string>()
    for (const e of (await observer.get('/api/entries')).body) if (e.status === 'approved') approvedIds.add(e.id)
    for (const e of (await moderator.get('/api/entries')).body) if (e.status === 'approved') approvedIds.add(e.id)
    expect(new Set(atlas.body.items.map((i: any) => i.id))).toEqual(approvedIds)

    const text = JSON.stringify(atlas.body)
    expect(text).not.toMatch(/@/)
    // The demo site is at 52.634, −1.692: only 52.6, −1.7 may appear.
    expect(text).not.toContain('52.634')
    expect(text).not.toContain('1.692')
    for (const item of atlas.body.items) {
      expect(Math.round(item.site.latitude * 10) / 10).toBe(item.site.latitude)
      const entry = await visitor.get(`/api/atlas/${item.id}`)
      expect(JSON.stringify(entry.body)).not.toMatch(/@|52\.634|1\.692/)
      expect(entry.body.disk.altitudeDeg).toBeUndefined()
    }
  })

  it('filters by phase, age and a colongitude range that may wrap through 0°', async () => {
    const visitor = new Client(app.url)
    const all = (await visitor.get('/api/atlas?perPage=60')).body.items
    expect(all.length).toBeGreaterThan(0)
    const sample = all[0]
    const byPhase = (await visitor.get(`/api/atlas?phase=${sample.phaseName}`)).body.items
    expect(byPhase.every((i: any) => i.phaseName === sample.phaseName)).toBe(true)
    const lo = (sample.colongitudeDeg - 1 + 360) % 360
    const hi = (sample.colongitudeDeg + 1) % 360
    const byLight = (await visitor.get(`/api/atlas?colongitudeMin=${lo}&colongitudeMax=${hi}`)).body.items
    expect(byLight.map((i: any) => i.id)).toContain(sample.id)
    const wrapped = (await visitor.get('/api/atlas?colongitudeMin=350&colongitudeMax=10')).body.items
    expect(wrapped.every((i: any) => i.colongitudeDeg >= 350 || i.colongitudeDeg <= 10)).toBe(true)
    const byAge = (await visitor.get(`/api/atlas?ageMin=${sample.ageDays - 0.5}&ageMax=${sample.ageDays + 0.5}`)).body.items
    expect(byAge.map((i: any) => i.id)).toContain(sample.id)
    expect((await visitor.get('/api/atlas?colongitudeMin=400')).status).toBe(400)
  })

  it('serves published images to anyone and unpublished ones to no visitor', async () => {
    const visitor = new Client(app.url)
    const published = (await visitor.get('/api/atlas')).body.items[0]
    const image = await fetch(`${app.url}/api/atlas/${published.id}/image?size=small`)
    expect(image.status).toBe(200)
    expect(image.headers.get('content-type')).toBe('image/webp')
    const draft = await savedSketch(observations[3]!.id)
    expect((await fetch(`${app.url}/api/atlas/${draft}/image`)).status).toBe(404)
    expect((await visitor.get(`/api/atlas/${draft}`)).status).toBe(404)
  })
})
