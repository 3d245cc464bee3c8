// Features over HTTP: forgiving search, who may propose and curate, pins on one's own sketches only,
// and the feature page and atlas filter built from published pins.

import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { savedSketch } from '../support/sketches'

let app: RunningApp
let observer: Client
let moderator: Client
let learner: Client
let visitor: Client
let observations: { id: string }[]

beforeAll(async () => {
  app = await startApp()
  observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
  moderator = new Client(app.url)
  await moderator.signIn(DEMO.moderator.email, DEMO.moderator.password)
  learner = new Client(app.url)
  await learner.signIn(DEMO.learner.email, DEMO.learner.password)
  visitor = new Client(app.url)
  observations = (await observer.get('/api/observations?perPage=50&sort=observedAt&dir=asc')).body.items
})
afterAll(async () => {
  await app?.stop()
})

describe('the gazetteer over HTTP', () => {
  it('lets an observer propose, refuses a learner, and finds names by alias and without accents', async () => {
    expect((await learner.post('/api/features', { name: 'Bright spot' })).status).toBe(403)
    expect((await visitor.post('/api/features', { name: 'Bright spot' })).status).toBe(401)
    const made = await observer.post('/api/features', { name: 'Crâter Ærdwell', description: 'Invented crater for the test.' })
    expect(made.status).toBe(201)
    // Case, accents and ligatures do not make a new name.
    expect((await observer.post('/api/features', { name: 'crater aerdwell' })).status).toBe(409)
    expect((await observer.post('/api/features', { name: 'CRÂTER ÆRDWELL' })).status).toBe(409)
    expect((await observer.post('/api/features', { name: '   ' })).status).toBe(400)
    expect((await observer.post('/api/features', { name: 'x'.repeat(81) })).status).toBe(400)

    const plain = (await observer.get('/api/features?q=crater%20aerdwel')).body.items
    expect(plain.map((f: any) => f.id)).toContain(made.body.id)
    const accentless = (await observer.get('/api/features?q=crater%20rdwell')).body.items
    expect(accentless.map((f: any) => f.id)).toContain(made.body.id)
    // A proposal no shown sketch supports is its proposer's until a moderator confirms it.
    expect((await visitor.get('/api/features?q=crater%20aerdwel')).body.items.map((f: any) => f.id)).not.toContain(made.body.id)

    expect((await observer.patch(`/api/features/${made.body.id}`, { name: 'Wellspring crater' })).status).toBe(403)
    expect((await moderator.patch(`/api/features/${made.body.id}`, { name: 'Wellspring crater', status: 'confirmed' })).status).toBe(200)
    const byOldName = (await visitor.get('/api/features?q=crater%20aerdwell')).body.items[0]
    expect(byOldName).toMatchObject({ id: made.body.id, name: 'Wellspring crater', matched: 'Crâter Ærdwell' })
  })
})

describe('pins', () => {
  it('pin a new name on one\'s own sketch, refuse the limb and other people\'s sketches', async () => {
    const sketch = await savedSketch(app.url, observer, observations[0]!.id)
    const pinned = await observer.post(`/api/sketches/${sketch}/tags`, { x: 0.1, y: 0.2, name: 'Ridge of the nine hills' })
    expect(pinned.status).toBe(201)
    expect(pinned.body.feature.name).toBe('Ridge of the nine hills')
    expect(Math.abs(pinned.body.latitude)).toBeLessThan(90)

    const beyond = await observer.post(`/api/sketches/${sketch}/tags`, { x: 0.9, y: 0.9, name: 'Off the edge' })
    expect(beyond.status).toBe(400)
    expect(beyond.body.message).toMatch(/beyond the limb/)
    expect((await moderator.post(`/api/sketches/${sketch}/tags`, { x: 0, y: 0, name: 'Not mine' })).status).toBe(404)
    expect((await learner.post(`/api/sketches/${sketch}/tags`, { x: 0, y: 0, name: 'Not mine' })).status).toBe(403)
    expect((await observer.post(`/api/sketches/${sketch}/tags`, { x: 0, y: 0, name: 'a', featureId: pinned.body.feature.id })).status).toBe(400)
    expect((await observer.get(`/api/sketches/${sketch}/tags`)).body).toHaveLength(1)
  })

  it('appear on the feature page and in the atlas feature filter once the sketch is published', async () => {
    const sketch = await savedSketch(app.url, observer, observations[1]!.id)
    const pin = await observer.post(`/api/sketches/${sketch}/tags`, { x: -0.2, y: 0.1, name: 'Quiet bay' })
    const featureId = pin.body.feature.id
    // Pinned on a draft only: the proposer sees the name, nobody else does.
    expect((await observer.get(`/api/features/${featureId}`)).body.entries).toHaveLength(0)
    expect((await visitor.get(`/api/features/${featureId}`)).status).toBe(404)
    await observer.post(`/api/entries/${sketch}/submit`)
    expect((await visitor.get(`/api/features/${featureId}`)).body.entries).toHaveLength(0)
    // Pins cannot change while the entry is in review.
    expect((await observer.post(`/api/sketches/${sketch}/tags`, { x: 0, y: 0, name: 'Late addition' })).status).toBe(409)
    await moderator.post(`/api/entries/${sketch}/decision`, { decision: 'approve' })
    const page = (await visitor.get(`/api/features/${featureId}`)).body
    expect(page.entries.map((e: any) => e.id)).toEqual([sketch])
    expect(page.colongitudeRange.min).toBe(page.entries[0].colongitudeDeg)
    expect(page.feature.pinCount).toBe(1)
    const atlas = (await visitor.get(`/api/atlas?feature=${featureId}`)).body
    expect(atlas.items.map((e: any) => e.id)).toEqual([sketch])
    const entry = (await visitor.get(`/api/atlas/${sketch}`)).body
    expect(entry.pins.map((p: any) => p.feature.name)).toEqual(['Quiet bay'])
  })

  it('merge duplicates for moderators only, and the merged feature\'s page points to the one it became', async () => {
    const sketch = await savedSketch(app.url, observer, observations[2]!.id)
    const a = (await observer.post(`/api/sketches/${sketch}/tags`, { x: 0.3, y: -0.1, name: 'Twin peaks' })).body.feature.id
    const b = (await observer.post(`/api/sketches/${sketch}/tags`, { x: 0.31, y: -0.1, name: 'Double mountain' })).body.feature.id
    expect((await observer.post(`/api/features/${a}/merge`, { into: b })).status).toBe(403)
    expect((await moderator.post(`/api/features/${a}/merge`, { into: a })).status).toBe(400)
    expect((await moderator.post(`/api/features/${a}/merge`, { into: b })).status).toBe(200)
    // Both names are on a draft, so only their proposer sees the pages.
    expect((await observer.get(`/api/features/${a}`)).body).toEqual({ mergedInto: b })
    const kept = (await observer.get(`/api/features/${b}`)).body
    expect(kept.aliases).toEqual(['Twin peaks'])
    expect(kept.feature.pinCount).toBe(2)
    expect((await observer.get(`/api/sketches/${sketch}/tags`)).body.every((p: any) => p.feature.id === b)).toBe(true)
  })

  it('project confirmed features onto another night\'s sketch and list those near its terminator', async () => {
    const first = await savedSketch(app.url, observer, observations[0]!.id)
    const named = (await observer.post(`/api/sketches/${first}/tags`, { x: 0, y: 0, name: 'Centre mark' })).body.feature.id
    await moderator.patch(`/api/features/${named}`, { status: 'confirmed' })
    const other = await savedSketch(app.url, observer, observations[4]!.id)
    const overlay = (await observer.get(`/api/sketches/${other}/overlay`)).body
    const shown = overlay.features.find((f: any) => f.id === named)
    expect(shown).toBeDefined()
    // A different night's libration puts the same place a little off the centre of the disk.
    expect(Math.hypot(shown.x, shown.y)).toBeGreaterThan(0.001)
    expect(Math.hypot(shown.x, shown.y)).toBeLessThan(0.3)
    expect(Array.isArray(overlay.nearTerminator)).toBe(true)
    const near = (await visitor.get('/api/features/near-terminator?colongitude=0&within=30')).body
    expect(near.every((f: any) => f.distanceDeg <= 30)).toBe(true)
  })
})
