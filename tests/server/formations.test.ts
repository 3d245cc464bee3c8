// The reference formations over HTTP: the list and search, a pin taking a standard name, the formation's
// page and the atlas filter built from pins inside its outline, and moderators linking user names to it.

import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { lunarCircumstances, selenographicToDisk } from '../../shared/lunar'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { savedSketch } from '../support/sketches'

let app: RunningApp
let observer: Client
let moderator: Client
let visitor: Client
let observations: { id: string }[]

beforeAll(async () => {
  app = await startApp()
  observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
  moderator = new Client(app.url)
  await moderator.signIn(DEMO.moderator.email, DEMO.moderator.password)
  visitor = new Client(app.url)
  observations = (await observer.get('/api/observations?perPage=50&sort=observedAt&dir=asc')).body.items
})
afterAll(async () => {
  await app?.stop()
})

/** Where a selenographic place falls on the saved sketch (the saved view is zenith-up, no flip). */
async function diskPointOf(sketchId: string, lat: number, lon: number) {
  const detail = (await observer.get(`/api/sketches/${sketchId}`)).body
  const c = lunarCircumstances(new Date(detail.observation.observedAt), detail.observation.site)
  return selenographicToDisk(lat, lon, c, { orientation: 'zenith-up', flip: 'none' })!
}

describe('the reference formations', () => {
  it('are listed for everyone and found by name, with a slip of a letter too', async () => {
    const all = (await visitor.get('/api/formations')).body.items
    expect(all.length).toBeGreaterThanOrEqual(150)
    // IAU/USGS Gazetteer of Planetary Nomenclature (values from memory): Copernicus 9.6° N, 20.1° W.
    const copernicus = all.find((f: any) => f.id === 'copernicus')
    expect(copernicus).toMatchObject({ name: 'Copernicus', kind: 'crater' })
    expect(Math.abs(copernicus.latitude - 9.62)).toBeLessThan(1)
    expect(Math.abs(copernicus.longitude + 20.08)).toBeLessThan(1)
    expect((await visitor.get('/api/formations?q=copern')).body.items[0].id).toBe('copernicus')
    expect((await visitor.get('/api/formations?q=copernikus')).body.items[0].id).toBe('copernicus')
    expect((await visitor.get('/api/formations?q=stofler')).body.items[0].name).toBe('Stöfler')
    // The gazetteer's search carries the standard names beside the users' own.
    expect((await visitor.get('/api/features?q=tych')).body.formations.map((f: any) => f.id)).toContain('tycho')
    expect((await visitor.get('/api/formations/atlantis')).status).toBe(404)
    expect((await visitor.get('/api/formations/Not%20a%20slug')).status).toBe(400)
  })

  it('give a pin its standard name, gather the sketch on the formation\'s page and in the atlas filter', async () => {
    const sketch = await savedSketch(app.url, observer, observations[3]!.id)
    const at = await diskPointOf(sketch, 9.7, -20.0)
    const pin = await observer.post(`/api/sketches/${sketch}/tags`, { ...at, formationId: 'copernicus' })
    expect(pin.status).toBe(201)
    expect(pin.body.feature).toMatchObject({ name: 'Copernicus', status: 'confirmed' })
    expect(Math.abs(pin.body.latitude - 9.7)).toBeLessThan(0.01)
    expect((await visitor.get(`/api/features/${pin.body.feature.id}`)).body.formation.id).toBe('copernicus')
    expect((await observer.post(`/api/sketches/${sketch}/tags`, { ...at, formationId: 'atlantis' })).status).toBe(400)
    expect((await observer.post(`/api/sketches/${sketch}/tags`, { ...at, formationId: 'copernicus', name: 'Both' })).status).toBe(400)

    // A second pin under the standard name joins the same feature.
    const other = await savedSketch(app.url, observer, observations[5]!.id)
    const again = await observer.post(`/api/sketches/${other}/tags`, { ...(await diskPointOf(other, 9.5, -20.2)), formationId: 'copernicus' })
    expect(again.body.feature.id).toBe(pin.body.feature.id)

    // Drafts stay out of public view.
    expect((await visitor.get('/api/formations/copernicus')).body.entries.map((e: any) => e.id)).not.toContain(sketch)
    expect((await visitor.get('/api/atlas?formation=copernicus')).body.items.map((e: any) => e.id)).not.toContain(sketch)
    await observer.post(`/api/entries/${sketch}/submit`)
    await moderator.post(`/api/entries/${sketch}/decision`, { decision: 'approve' })

    const page = (await visitor.get('/api/formations/copernicus')).body
    expect(page.entries.map((e: any) => e.id)).toContain(sketch)
    expect(page.features.map((f: any) => f.name)).toContain('Copernicus')
    const colongitudes = page.entries.map((e: any) => e.colongitudeDeg)
    expect(colongitudes).toEqual([...colongitudes].sort((a: number, b: number) => a - b))
    expect((await visitor.get('/api/atlas?formation=copernicus')).body.items.map((e: any) => e.id)).toContain(sketch)
    // Tycho's outline is far from this pin.
    expect((await visitor.get('/api/atlas?formation=tycho')).body.items.map((e: any) => e.id)).not.toContain(sketch)
    const bad = await visitor.get('/api/atlas?formation=Not!a!slug')
    expect(bad.status).toBe(400)
  })

  it('find a sketch whatever the pin was named, when the pin lies inside the formation', async () => {
    const sketch = await savedSketch(app.url, observer, observations[6]!.id)
    // Plato: IAU/USGS Gazetteer (values from memory) 51.6° N, 9.4° W, 101 km across.
    await observer.post(`/api/sketches/${sketch}/tags`, { ...(await diskPointOf(sketch, 51.4, -9.0)), name: 'Dark floor on the north shore' })
    await observer.post(`/api/entries/${sketch}/submit`)
    await moderator.post(`/api/entries/${sketch}/decision`, { decision: 'approve' })
    expect((await visitor.get('/api/atlas?formation=plato')).body.items.map((e: any) => e.id)).toContain(sketch)
    expect((await visitor.get('/api/formations/plato')).body.entries.map((e: any) => e.id)).toContain(sketch)
    expect((await visitor.get('/api/atlas?formation=archimedes')).body.items.map((e: any) => e.id)).not.toContain(sketch)
  })

  it('let moderators link a user name to a formation, and merges carry the link', async () => {
    const made = (await observer.post('/api/features', { name: 'The great ray crater' })).body.id
    expect((await observer.patch(`/api/features/${made}`, { formationId: 'tycho' })).status).toBe(403)
    expect((await moderator.patch(`/api/features/${made}`, { formationId: 'atlantis' })).status).toBe(400)
    expect((await moderator.patch(`/api/features/${made}`, { formationId: 'Tycho!' })).status).toBe(400)
    expect((await observer.get(`/api/features/${made}`)).body.formation).toBeNull()
    expect((await moderator.patch(`/api/features/${made}`, { formationId: 'tycho' })).status).toBe(200)
    expect((await observer.get(`/api/features/${made}`)).body.formation.id).toBe('tycho')
    expect((await observer.get('/api/formations/tycho')).body.features.map((f: any) => f.id)).toContain(made)
    // A proposal pinned on no submitted sketch stays its proposer's until one is.
    expect((await visitor.get('/api/formations/tycho')).body.features.map((f: any) => f.id)).not.toContain(made)

    const twin = (await observer.post('/api/features', { name: 'Bright crater of the south' })).body.id
    expect((await moderator.post(`/api/features/${made}/merge`, { into: twin })).status).toBe(200)
    expect((await observer.get(`/api/features/${twin}`)).body.formation.id).toBe('tycho')
    expect((await moderator.patch(`/api/features/${twin}`, { formationId: null })).status).toBe(200)
    expect((await observer.get(`/api/features/${twin}`)).body.formation).toBeNull()
  })
})
