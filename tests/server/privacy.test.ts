// Who sees what: for every route that returns a site, times, drafts or names, what each of a signed-out
// visitor, a learner, the owner, another observer, a moderator and an administrator receives, field by field.
// The rules (the product's): a draft is its owner's alone; a reviewer sees a submitted entry with the site
// rounded to 0.1° as in the atlas and times to the minute; an administrator's powers are over accounts, not
// content; a name proposed on a private draft is not public.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { computeNight } from '../../shared/observing/night'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { savedSketch } from '../support/sketches'

type Actor = 'visitor' | 'learner' | 'owner' | 'other' | 'moderator' | 'admin'
const ACTORS: Actor[] = ['visitor', 'learner', 'owner', 'other', 'moderator', 'admin']
/** A status, or a check of the 200 answer's body. */
type Expect = number | ((body: any) => void)

let app: RunningApp
const as = {} as Record<Actor, Client>
let draftId: string
let submittedId: string
let approvedId: string
let draftFeature: { id: string, name: string }
let exactSite: { latitude: number, longitude: number, timeZone: string }

const minute = (iso: string | null) => expect(iso === null || /:00\.000Z$/.test(iso)).toBe(true)
const other404 = { visitor: 401, learner: 403, other: 404, moderator: 404, admin: 404 }

/** Every place on Earth in the answer is rounded to 0.1° (pins, which are places on the Moon, aside). */
function noExactSite(body: unknown) {
  const walk = (value: unknown, key: string) => {
    if (key === 'pins' || value === null || typeof value !== 'object') return
    for (const [k, v] of Object.entries(value)) {
      if ((k === 'latitude' || k === 'longitude') && typeof v === 'number') expect(Math.round(v * 10) / 10, `${k} ${v}`).toBe(v)
      walk(v, k)
    }
  }
  walk(body, '')
  expect(JSON.stringify(body)).not.toContain(`"latitude":${exactSite.latitude},"longitude":${exactSite.longitude}`)
}

/** What a reviewer receives of the entry: rounded place, minutes, circumstances for the rounded place. */
function reviewerView(body: any) {
  const o = body.observation
  minute(o.observedAt)
  expect(o.localTime).toMatch(/^\d{2}:\d{2}$/)
  expect(o.site.id).toBe('')
  const rounded = { latitude: Math.round(exactSite.latitude * 10) / 10, longitude: Math.round(exactSite.longitude * 10) / 10 }
  expect(o.site.name).toBe(`near ${rounded.latitude}°, ${rounded.longitude}°`)
  for (const body of ['moon', 'sun'] as const) for (const event of ['rise', 'transit', 'set'] as const) minute(o.circumstances[body][event])
  const expected = computeNight(new Date(o.observedAt), { ...rounded, elevation: 0, timeZone: exactSite.timeZone })
  expect(o.circumstances.altitudeDeg).toBeCloseTo(expected.altitudeDeg, 9)
  expect(o.circumstances.azimuthDeg).toBeCloseTo(expected.azimuthDeg, 9)
  for (const m of [o.altitude, o.azimuth].filter(Boolean)) {
    expect(Math.round(m.predictedDeg * 10) / 10).toBe(m.predictedDeg)
    expect(Math.round(m.residualDeg * 10) / 10).toBe(m.residualDeg)
  }
  noExactSite(body)
}

function ownerEditorView(body: any) {
  expect(body.observation.site.latitude).toBe(exactSite.latitude)
  expect(body.observation.site.longitude).toBe(exactSite.longitude)
}

const names = (body: any) => (body.items as { name: string }[]).map(i => i.name)

interface Case {
  route: string
  path: () => string
  expect: Record<Actor, Expect>
}

const CASES: Case[] = [
  // The editor's data: the exact site and the drawing. The owner's alone, drafts and entries alike.
  { route: 'GET /api/sketches/{draft}', path: () => `/api/sketches/${draftId}`, expect: { ...other404, owner: ownerEditorView } },
  { route: 'GET /api/sketches/{submitted}', path: () => `/api/sketches/${submittedId}`, expect: { ...other404, owner: ownerEditorView } },
  ...['raster', 'thumbnail', 'revisions', 'tags', 'overlay'].map(sub => ({
    route: `GET /api/sketches/{draft}/${sub}`,
    path: () => `/api/sketches/${draftId}/${sub}`,
    expect: { ...other404, owner: 200 },
  })),
  // A submitted entry's drawing and pins are what a review needs; its history and overlay are not.
  ...['raster', 'thumbnail', 'tags'].map(sub => ({
    route: `GET /api/sketches/{submitted}/${sub}`,
    path: () => `/api/sketches/${submittedId}/${sub}`,
    expect: { ...other404, owner: 200, moderator: 200, admin: 200 },
  })),
  ...['revisions', 'overlay'].map(sub => ({
    route: `GET /api/sketches/{submitted}/${sub}`,
    path: () => `/api/sketches/${submittedId}/${sub}`,
    expect: { ...other404, owner: 200 },
  })),
  {
    route: 'GET /api/review/{submitted}',
    path: () => `/api/review/${submittedId}`,
    expect: { visitor: 401, learner: 403, owner: 403, other: 403, moderator: reviewerView, admin: reviewerView },
  },
  {
    route: 'GET /api/review/{draft}',
    path: () => `/api/review/${draftId}`,
    expect: { visitor: 401, learner: 403, owner: 403, other: 403, moderator: 404, admin: 404 },
  },
  {
    route: 'GET /api/review/queue',
    path: () => '/api/review/queue?perPage=100',
    expect: {
      visitor: 401, learner: 403, owner: 403, other: 403,
      ...Object.fromEntries((['moderator', 'admin'] as const).map(actor => [actor, (body: any) => {
        const ids = body.items.map((i: any) => i.id)
        expect(ids).toContain(submittedId)
        expect(ids).not.toContain(draftId)
        for (const item of body.items) minute(item.observedAt)
      }])) as Record<'moderator' | 'admin', Expect>,
    },
  },
  {
    route: 'GET /api/entries/{submitted}/history',
    path: () => `/api/entries/${submittedId}/history`,
    expect: { visitor: 401, learner: 403, owner: 200, other: 404, moderator: 200, admin: 200 },
  },
  // The observation behind an entry, and the sites: the owner's alone.
  {
    route: 'GET /api/observations/{owner\'s}',
    path: () => `/api/observations/${ownerObservationId}`,
    expect: { visitor: 401, learner: 404, owner: 200, other: 404, moderator: 404, admin: 404 },
  },
  {
    route: 'GET /api/sites',
    path: () => '/api/sites',
    expect: {
      visitor: 401,
      ...Object.fromEntries((['learner', 'other', 'moderator', 'admin'] as const).map(actor => [actor, (body: any) => {
        // A shared group site (the demo club's school field) is every member's by design; their own places
        // and other people's stay out of it.
        expect(body.filter((s: any) => !s.groupSite).map((s: any) => [s.latitude, s.longitude])).not.toContainEqual([exactSite.latitude, exactSite.longitude])
      }])) as Record<'learner' | 'other' | 'moderator' | 'admin', Expect>,
      owner: (body: any) => expect(body.map((s: any) => [s.latitude, s.longitude])).toContainEqual([exactSite.latitude, exactSite.longitude]),
    },
  },
  // The atlas is public and shows the site rounded to 0.1°.
  {
    route: 'GET /api/atlas/{approved}',
    path: () => `/api/atlas/${approvedId}`,
    expect: Object.fromEntries(ACTORS.map(actor => [actor, (body: any) => {
      expect(body.entry.site).toEqual({ latitude: Math.round(exactSite.latitude * 10) / 10, longitude: Math.round(exactSite.longitude * 10) / 10 })
      noExactSite(body)
    }])) as Record<Actor, Expect>,
  },
  // A name proposed on a draft: its proposer sees it; nobody else, moderators and admins included.
  {
    route: 'GET /api/features?q={draft name}',
    path: () => `/api/features?q=${encodeURIComponent(draftFeature.name)}`,
    expect: Object.fromEntries(ACTORS.map(actor => [actor, actor === 'owner'
      ? (body: any) => expect(names(body)).toContain(draftFeature.name)
      : (body: any) => expect(names(body)).not.toContain(draftFeature.name)])) as Record<Actor, Expect>,
  },
  {
    route: 'GET /api/features',
    path: () => '/api/features?perPage=100&status=proposed',
    expect: Object.fromEntries(ACTORS.map(actor => [actor, actor === 'owner'
      ? (body: any) => expect(names(body)).toContain(draftFeature.name)
      : (body: any) => expect(names(body)).not.toContain(draftFeature.name)])) as Record<Actor, Expect>,
  },
  {
    route: 'GET /api/features/{draft name}',
    path: () => `/api/features/${draftFeature.id}`,
    expect: { visitor: 404, learner: 404, owner: 200, other: 404, moderator: 404, admin: 404 },
  },
]

let ownerObservationId: string

beforeAll(async () => {
  app = await startApp()
  for (const actor of ACTORS) as[actor] = new Client(app.url)
  await as.learner.signIn(DEMO.learner.email, DEMO.learner.password)
  await as.owner.signIn(DEMO.observer.email, DEMO.observer.password)
  await as.moderator.signIn(DEMO.moderator.email, DEMO.moderator.password)
  await as.admin.signIn(DEMO.admin.email, DEMO.admin.password)
  // Another observer: a new account, made an observer by the administrator.
  const email = 'tamsin.other@example.test'
  await as.other.post('/api/auth/sign-up', { name: 'Tamsin Quarrie', email, password: 'another-long-secret' })
  const found = await as.admin.get('/api/admin/users?q=tamsin')
  await as.admin.patch(`/api/admin/users/${found.body.items[0].id}`, { role: 'observer' })
  await as.other.signIn(email, 'another-long-secret')

  // The demo's submitted entry, one of its published ones, and a new draft with a pin naming a new feature.
  const queue = await as.moderator.get('/api/review/queue')
  submittedId = queue.body.items[0].id
  approvedId = (await as.visitor.get('/api/atlas')).body.items[0].id
  const observations = await as.owner.get('/api/observations?perPage=100')
  const withoutSketch = observations.body.items.find((o: any) => o.sketches.length === 0)
  ownerObservationId = withoutSketch.id
  draftId = await savedSketch(app.url, as.owner, ownerObservationId)
  const pinned = await as.owner.post(`/api/sketches/${draftId}/tags`, { x: 0.1, y: 0.1, name: 'Fenwright Draft Hollow' })
  expect(pinned.status).toBe(201)
  const pins = await as.owner.get(`/api/sketches/${draftId}/tags`)
  draftFeature = pins.body.find((p: any) => p.feature.name === 'Fenwright Draft Hollow').feature
  const sites = await as.owner.get('/api/sites')
  const site = sites.body.find((s: any) => s.id === withoutSketch.site.id)
  exactSite = { latitude: site.latitude, longitude: site.longitude, timeZone: site.timeZone }
})
afterAll(async () => {
  await app?.stop()
})

describe('privacy from every role', () => {
  for (const c of CASES) {
    it.each(ACTORS)(`${c.route} as %s`, async (actor) => {
      const answer = await as[actor].get(c.path())
      const wanted = c.expect[actor]
      if (typeof wanted === 'number') {
        expect(answer.status).toBe(wanted)
      }
      else {
        expect(answer.status).toBe(200)
        wanted(answer.body)
      }
    })
  }

  it('makes a proposed name public once a submitted sketch pins it', async () => {
    expect((await as.visitor.get(`/api/features/${draftFeature.id}`)).status).toBe(404)
    expect((await as.owner.post(`/api/entries/${draftId}/submit`)).status).toBe(200)
    expect((await as.visitor.get(`/api/features/${draftFeature.id}`)).status).toBe(200)
    expect(names((await as.visitor.get(`/api/features?q=${encodeURIComponent(draftFeature.name)}`)).body)).toContain(draftFeature.name)
  })
})
