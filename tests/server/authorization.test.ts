import { readdirSync, statSync } from 'node:fs'
import { join, relative, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ROLES, roleRank, type Role } from '../../shared/roles'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'

// Every API route, and the least role it needs (null: open to everyone). A new
// route file that is missing here fails the first test, so none goes unchecked.
const ROUTES: Record<string, Role | null> = {
  'GET /api/health': null,
  'POST /api/auth/sign-up': null,
  'POST /api/auth/sign-in': null,
  'POST /api/auth/sign-out': null,
  'POST /api/auth/verify-email': null,
  'POST /api/auth/forgot-password': null,
  'POST /api/auth/reset-password': null,
  'POST /api/auth/resend-verification': 'learner',
  'GET /api/sites': 'learner',
  'POST /api/sites': 'learner',
  'PATCH /api/sites/[id]': 'learner',
  'DELETE /api/sites/[id]': 'learner',
  'GET /api/sites/time-zone': 'learner',
  'GET /api/observations': 'learner',
  'POST /api/observations': 'learner',
  'GET /api/observations/[id]': 'learner',
  'PUT /api/observations/[id]': 'learner',
  'DELETE /api/observations/[id]': 'learner',
  'GET /api/observations/export': 'learner',
  'GET /api/worksheet': 'learner',
  'GET /api/tonight': 'learner',
  'GET /api/photos': 'learner',
  'POST /api/photos': 'learner',
  'PATCH /api/photos/[id]': 'learner',
  'DELETE /api/photos/[id]': 'learner',
  'GET /api/photos/[id]/image': 'learner',
  'GET /api/atlas': null,
  'GET /api/atlas/[id]': null,
  'GET /api/atlas/[id]/image': null,
  'GET /api/entries': 'observer',
  'POST /api/entries/[id]/submit': 'observer',
  'GET /api/entries/[id]/history': 'observer',
  'POST /api/entries/[id]/decision': 'moderator',
  'GET /api/review/queue': 'moderator',
  'GET /api/review/[id]': 'moderator',
  'GET /api/features': null,
  'GET /api/features/[id]': null,
  'GET /api/features/near-terminator': null,
  'POST /api/features': 'observer',
  'PATCH /api/features/[id]': 'moderator',
  'POST /api/features/[id]/merge': 'moderator',
  'GET /api/formations': null,
  'GET /api/formations/[id]': null,
  'GET /api/sketches/[id]/tags': 'observer',
  'POST /api/sketches/[id]/tags': 'observer',
  'DELETE /api/sketches/[id]/tags/[tagId]': 'observer',
  'GET /api/sketches/[id]/overlay': 'observer',
  'GET /api/admin/users': 'admin',
  'PATCH /api/admin/users/[id]': 'admin',
  'GET /api/admin/mail': 'admin',
  'GET /api/admin/outbox': 'admin',
  'POST /api/admin/outbox/[id]/resend': 'admin',
  'POST /api/auth/password': 'learner',
  'GET /api/sketches/offline-worker': null,
  'GET /api/sketches': 'observer',
  'POST /api/sketches': 'observer',
  'GET /api/sketches/[id]': 'observer',
  'PUT /api/sketches/[id]': 'observer',
  'PATCH /api/sketches/[id]': 'observer',
  'GET /api/sketches/[id]/revisions/[version]/thumbnail': 'observer',
  'POST /api/sketches/[id]/revisions/[version]/restore': 'observer',
  'GET /api/sketches/[id]/revisions': 'observer',
  'GET /api/sketches/[id]/thumbnail': 'observer',
  'GET /api/sketches/[id]/raster': 'observer',
  'GET /api/groups': 'learner',
  'POST /api/groups': 'observer',
  'POST /api/groups/join': 'learner',
  'GET /api/groups/[id]': 'learner',
  'PATCH /api/groups/[id]': 'learner',
  'POST /api/groups/[id]/sites': 'learner',
  'DELETE /api/groups/[id]/sites/[siteId]': 'learner',
  'POST /api/groups/[id]/invitations': 'learner',
  'DELETE /api/groups/[id]/invitations/[invitationId]': 'learner',
  'POST /api/groups/[id]/join-code': 'learner',
  'PATCH /api/groups/[id]/membership': 'learner',
  'PATCH /api/groups/[id]/members/[userId]': 'learner',
  'DELETE /api/groups/[id]/members/[userId]': 'learner',
  'GET /api/groups/[id]/proposal': 'learner',
  'POST /api/groups/[id]/campaigns': 'learner',
  'GET /api/invitations/preview': null,
  'POST /api/invitations/accept': 'learner',
  'POST /api/invitations/sign-up': null,
  'GET /api/campaigns': 'learner',
  'GET /api/campaigns/[id]': 'learner',
  'PATCH /api/campaigns/[id]': 'learner',
  'GET /api/campaigns/[id]/grid': 'learner',
  'GET /api/campaigns/[id]/comparison': 'learner',
  'GET /api/campaigns/[id]/export': 'learner',
  'GET /api/campaigns/[id]/comments': 'learner',
  'POST /api/campaigns/[id]/comments': 'learner',
  'GET /api/campaigns/[id]/members/[userId]': 'learner',
  'GET /api/campaigns/[id]/sketches/[sketchId]/thumbnail': 'learner',
  'POST /api/campaigns/opt-out': null,
  // Last: it ends the test clients' sessions.
  'POST /api/auth/sign-out-everywhere': 'learner',
}

const apiDir = resolve(import.meta.dirname, '../../server/api')

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? routeFiles(path) : [path]
  })
}

function routeKey(file: string): string {
  const rel = relative(apiDir, file).replace(/\.ts$/, '')
  const match = rel.match(/^(.*?)(?:\.(get|post|put|patch|delete))?$/)!
  const path = `/api/${match[1]!.replace(/(^|\/)index$/, '')}`.replace(/\/$/, '')
  return `${(match[2] ?? 'get').toUpperCase()} ${path}`
}

const SAMPLE_ID = '00000000-0000-4000-8000-000000000000'
const concrete = (path: string) => path.replace(/\[[^\]]+\]/g, SAMPLE_ID)

let app: RunningApp
const clients = {} as Record<Exclude<Role, 'admin'>, Client>

beforeAll(async () => {
  app = await startApp()
  for (const role of ['learner', 'observer', 'moderator'] as const) {
    clients[role] = new Client(app.url)
    await clients[role].signIn(DEMO[role].email, DEMO[role].password)
  }
})
afterAll(async () => {
  await app?.stop()
})

describe('authorization', () => {
  it('knows every route file', () => {
    expect(routeFiles(apiDir).map(routeKey).sort()).toEqual(Object.keys(ROUTES).sort())
  })

  const protectedRoutes = Object.entries(ROUTES).filter((entry): entry is [string, Role] => entry[1] !== null)

  it.each(protectedRoutes)('%s answers 401 when signed out', async (key) => {
    const [method, path] = key.split(' ') as [string, string]
    const answer = await new Client(app.url).request(method, concrete(path), method === 'GET' ? undefined : {})
    expect(answer.status).toBe(401)
  })

  it.each(protectedRoutes)('%s answers 403 to every role below %s', async (key, needed) => {
    const [method, path] = key.split(' ') as [string, string]
    const below = ROLES.filter(r => roleRank(r) < roleRank(needed)) as Exclude<Role, 'admin'>[]
    for (const role of below) {
      const answer = await clients[role].request(method, concrete(path), method === 'GET' ? undefined : {})
      expect(answer.status, `${role} on ${key}`).toBe(403)
    }
  })

  it.each(protectedRoutes)('%s lets the role it needs past the role check', async (key, needed) => {
    const [method, path] = key.split(' ') as [string, string]
    const client = needed === 'admin' ? new Client(app.url) : clients[needed]
    if (needed === 'admin') await client.signIn(DEMO.admin.email, DEMO.admin.password)
    const answer = await client.request(method, concrete(path), method === 'GET' ? undefined : {})
    expect([401, 403]).not.toContain(answer.status)
  })
})
