// The progress grid under load: a leader's class of 40 members over a 16-night campaign with their
// observations, measurements and sketches, through HTTP with 10 concurrent clients, against a trivial JSON
// route on the same server in the same run. The load comes from this process; the server runs in its own.
//   npm run build && npm run bench:campaign   → prints the figures and writes bench/results/campaign.json

import { randomUUID } from 'node:crypto'
import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import SQLite from 'better-sqlite3'
import { createDatabase } from '../db/connect'
import { migrateToLatest } from '../db/migrate'
import { freshDataDir, machine, measure, random, root, startServer } from './support/http'

const MEMBERS = 40
const NIGHTS = 16
const CONNECTIONS = 10
const AMOUNT = 2000
const LEADER = { name: 'Bench leader', email: 'bench-leader@example.test', password: 'bench-leader-password' }

const dataDir = freshDataDir('campaign')
const kysely = await createDatabase({ url: '', dataDir })
await migrateToLatest(kysely)
await kysely.destroy()

const server = await startServer(dataDir, 3952)
try {
  // The leader signs up through the app (so the password is hashed as the app does), then is confirmed.
  const signUp = await fetch(`${server.url}/api/auth/sign-up`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(LEADER) })
  if (signUp.status !== 202) throw new Error(`sign-up failed: ${signUp.status}`)
  const db = new SQLite(join(dataDir, 'shadowline.sqlite'))
  db.pragma('busy_timeout = 5000')
  const at = '2026-11-01T00:00:00.000Z'
  const leaderId = (db.prepare('select id from users where email = ?').get(LEADER.email) as { id: string }).id
  db.prepare(`update users set role = 'observer', email_verified_at = ? where id = ?`).run(at, leaderId)

  const rand = random(1202)
  const groupId = randomUUID()
  const groupSiteId = randomUUID()
  const campaignId = randomUUID()
  const nights = Array.from({ length: NIGHTS }, (_, i) => `2026-11-${String(11 + i).padStart(2, '0')}`)
  let observations = 0
  db.transaction(() => {
    db.prepare(`insert into groups (id, name, description, visibility, join_code, join_approval, created_by, created_at, updated_at) values (?, 'Bench class', '', 'private', null, 0, ?, ?, ?)`).run(groupId, leaderId, at, at)
    db.prepare(`insert into group_sites (id, group_id, name, latitude, longitude, elevation_m, time_zone, created_at, updated_at) values (?, ?, 'Field', 52.6, -1.7, 90, 'Europe/London', ?, ?)`).run(groupSiteId, groupId, at, at)
    const member = db.prepare(`insert into group_members (id, group_id, user_id, role, status, reminders, created_at, updated_at) values (?, ?, ?, ?, 'active', 0, ?, ?)`)
    member.run(randomUUID(), groupId, leaderId, 'leader', at, at)
    db.prepare(`insert into campaigns (id, group_id, title, brief, kind, group_site_id, clock_time, nights, asks_sketch, asks_altitude, asks_azimuth, reminder_minutes, created_by, created_at, updated_at)
      values (?, ?, 'Bench campaign', '', 'evening', ?, '17:30', ?, 1, 1, 1, 60, ?, ?, ?)`).run(campaignId, groupId, groupSiteId, JSON.stringify(nights), leaderId, at, at)
    const user = db.prepare(`insert into users (id, email, name, password_hash, role, email_verified_at, created_at, updated_at) values (?, ?, ?, 'x', 'observer', ?, ?, ?)`)
    const site = db.prepare(`insert into sites (id, user_id, name, latitude, longitude, elevation_m, time_zone, group_site_id, created_at, updated_at) values (?, ?, 'Field', 52.6, -1.7, 90, 'Europe/London', ?, ?, ?)`)
    const privateSite = db.prepare(`insert into sites (id, user_id, name, latitude, longitude, elevation_m, time_zone, created_at, updated_at) values (?, ?, 'Home', 52.5, -1.6, 80, 'Europe/London', ?, ?)`)
    const observation = db.prepare(`insert into observations (id, user_id, site_id, observed_at, local_date, time_zone, instrument_kind, view, notes, circumstances, computed_with,
      illuminated_fraction, age_days, phase_name, colongitude_deg, created_at, updated_at) values (?, ?, ?, ?, ?, 'Europe/London', 'naked-eye', 'upright', '', '{}', 'bench', 0.3, 5, 'waxing-crescent', 320, ?, ?)`)
    const measurement = db.prepare(`insert into measurements (id, observation_id, kind, raw_deg, derived_deg, predicted_deg, residual_deg, declination_deg, created_at) values (?, ?, ?, 0, ?, ?, ?, null, ?)`)
    const sketch = db.prepare(`insert into sketches (id, observation_id, user_id, status, version, schema_version, shapes, view_orientation, view_flip, created_at, updated_at) values (?, ?, ?, ?, 1, 1, '{}', 'zenith-up', 'none', ?, ?)`)
    for (let m = 0; m < MEMBERS; m++) {
      const id = randomUUID()
      user.run(id, `bench${m}@example.test`, `Member ${String(m + 1).padStart(2, '0')}`, at, at, at)
      member.run(randomUUID(), groupId, id, 'member', at, at)
      const siteId = randomUUID()
      site.run(siteId, id, groupSiteId, at, at)
      const homeId = randomUUID()
      privateSite.run(homeId, id, at, at)
      for (const night of nights) {
        // About three nights in four at the group site; now and then one from home, which the grid must skip.
        const where = rand() < 0.75 ? siteId : rand() < 0.3 ? homeId : null
        if (!where) continue
        const obs = randomUUID()
        observation.run(obs, id, where, `${night}T17:30:00.000Z`, night, at, at)
        observations++
        if (rand() < 0.8) {
          measurement.run(randomUUID(), obs, 'altitude', 20, 21, -1, at)
          measurement.run(randomUUID(), obs, 'azimuth', 200, 204, -4, at)
        }
        const r = rand()
        if (r < 0.4) sketch.run(randomUUID(), obs, id, r < 0.05 ? 'approved' : r < 0.15 ? 'submitted' : 'draft', at, at)
      }
    }
  })()
  db.close()

  const signIn = await fetch(`${server.url}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: LEADER.email, password: LEADER.password }) })
  const cookie = signIn.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const grid = await fetch(`${server.url}/api/campaigns/${campaignId}/grid`, { headers: { cookie } })
  if (grid.status !== 200) throw new Error(`grid answered ${grid.status}`)
  const body = await grid.json() as { rows: unknown[], nights: unknown[], queries: number }
  console.log(`Grid: ${body.rows.length} rows × ${body.nights.length} nights, ${body.queries} queries`)

  const headers = { cookie }
  await measure(server.url, ['/api/health'], CONNECTIONS, 500, undefined, headers)
  await measure(server.url, [`/api/campaigns/${campaignId}/grid`], CONNECTIONS, 300, undefined, headers)
  const trivial = await measure(server.url, ['/api/health'], CONNECTIONS, AMOUNT, undefined, headers)
  const gridTiming = await measure(server.url, [`/api/campaigns/${campaignId}/grid`], CONNECTIONS, AMOUNT, undefined, headers)
  // For context: a small signed-in route (the session and one query), to show what signing in alone costs.
  const signedIn = await measure(server.url, ['/api/groups'], CONNECTIONS, AMOUNT, undefined, headers)
  const results = {
    generatedAt: new Date().toISOString(),
    machine: machine(),
    data: { members: MEMBERS, nights: NIGHTS, observations, gridRows: body.rows.length, gridQueries: body.queries },
    load: { connections: CONNECTIONS, requestsPerRoute: AMOUNT, tool: 'autocannon', loadGenerator: 'separate process from the server' },
    routes: { trivial, grid: gridTiming, signedInList: signedIn },
    ratios: { gridP95VsTrivial: gridTiming.p95Ms / trivial.p95Ms, gridMedianVsTrivial: gridTiming.medianMs / trivial.medianMs, gridP95VsSignedInList: gridTiming.p95Ms / signedIn.p95Ms },
    goal: 'gridP95VsTrivial ≤ 3',
  }
  mkdirSync(join(root, 'bench/results'), { recursive: true })
  writeFileSync(join(root, 'bench/results/campaign.json'), `${JSON.stringify(results, null, 2)}\n`)
  console.table({ trivial, grid: gridTiming, signedInList: signedIn })
  console.log(results.ratios)
}
finally {
  server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
