import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, startApp, waitForMail, type RunningApp } from '../support/app'

// Groups and campaigns over HTTP: who sees what through a group, and the invitation and join-code tokens.
// The scenario: the demo moderator leads a new group A; a newcomer joins it from an e-mailed invitation;
// the demo club (group B, led by the demo observer) already has pupils. Privacy rules are the product's:
// members see each other by display name only, nobody's e-mail or own site leaks, outsiders (an admin
// included) get nothing.

let app: RunningApp
const leaderA = () => clients.leaderA!
const clients: Record<string, Client> = {}
let groupA: string
let groupB: string
let siteA: string
let campaignA: string
let nights: string[]
let memberAId: string
let inviteMail = ''

const DEMO_PUPIL = { email: 'kofi@shadowline.test', password: 'moonlit-member' }
const NEWCOMER = { email: 'ada.newcomer@example.test', name: 'Ada N.', password: 'a-long-enough-password' }

function sql(): Database.Database {
  return new Database(join(app.dataDir, 'shadowline.sqlite'))
}

function count(table: string): number {
  const db = sql()
  try {
    return (db.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n
  }
  finally {
    db.close()
  }
}

async function invite(email: string): Promise<string> {
  const answer = await leaderA().post(`/api/groups/${groupA}/invitations`, { emails: [email] })
  expect(answer.status).toBe(201)
  const mail = await waitForMail(app.dataDir, email, /invited to join/)
  const match = mail.text.match(/\/groups\/join\?token=([\w-]+)/)
  expect(match).not.toBeNull()
  return match![1]!
}

const observation = (siteId: string, localDate: string, extra: Record<string, unknown> = {}) => ({
  siteId, localDate, localTime: '17:30', instrument: { kind: 'naked-eye' }, view: 'upright',
  clinometerReadingDeg: 70, compassBearingDeg: 200, notes: 'Clear above the trees.', ...extra,
})

beforeAll(async () => {
  app = await startApp()
  for (const [key, who] of Object.entries({ leaderA: DEMO.moderator, leaderB: DEMO.observer, admin: DEMO.admin, memberB: DEMO_PUPIL })) {
    clients[key] = new Client(app.url)
    await clients[key].signIn(who.email, who.password)
  }
  const created = await leaderA().post('/api/groups', { name: 'Toller evening class', description: 'Thursday group' })
  expect(created.status).toBe(201)
  groupA = created.body.id
  const site = await leaderA().post(`/api/groups/${groupA}/sites`, { name: 'Village green', latitude: 52.6, longitude: -1.65, elevation: 90 })
  expect(site.status).toBe(201)
  siteA = site.body.id
  // The November 2026 waxing evenings (new moon 2026-11-09, full moon 2026-11-24, from the phase tables
  // of the lunar module, checked there against published times).
  const proposal = await leaderA().get(`/api/groups/${groupA}/proposal?groupSiteId=${siteA}&kind=evening&from=2026-11-09`)
  expect(proposal.status).toBe(200)
  nights = proposal.body.nights.filter((n: { proposed: boolean }) => n.proposed).map((n: { localDate: string }) => n.localDate)
  const campaign = await leaderA().post(`/api/groups/${groupA}/campaigns`, {
    title: 'November crescent', kind: 'evening', groupSiteId: siteA, nights, clockTime: '17:30',
    asks: { sketch: true, altitude: true, azimuth: true },
  })
  expect(campaign.status).toBe(201)
  campaignA = campaign.body.id

  // The newcomer signs up from the invitation link and lands in the group, confirmed.
  const token = await invite(NEWCOMER.email)
  clients.memberA = new Client(app.url)
  const signedUp = await clients.memberA.post('/api/invitations/sign-up', { token, name: NEWCOMER.name, password: NEWCOMER.password })
  expect(signedUp.status).toBe(201)
  expect(signedUp.body.user.role).toBe('observer')
  memberAId = signedUp.body.user.id
  inviteMail = token

  // The newcomer logs one campaign evening at the group site, one at a private site of their own.
  const sites = (await clients.memberA.get('/api/sites')).body as { id: string, name: string, groupSite: boolean }[]
  const copy = sites.find(s => s.name === 'Village green')!
  expect(copy.groupSite).toBe(true)
  expect((await clients.memberA.post('/api/observations', observation(copy.id, nights[2]!))).status).toBe(201)
  const home = await clients.memberA.post('/api/sites', { name: 'Ada back garden', latitude: 52.61234, longitude: -1.66789, elevation: 80 })
  expect((await clients.memberA.post('/api/observations', observation(home.body.id, nights[3]!, { notes: 'garden-only note' }))).status).toBe(201)

  groupB = (await clients.leaderB!.get('/api/groups')).body.find((g: { name: string }) => g.name === 'Brackenfield Moonwatchers').id
  // Someone in no group at all: a new sign-up.
  clients.nonMember = new Client(app.url)
  expect((await clients.nonMember.post('/api/auth/sign-up', { name: 'Passer-by', email: 'passer-by@example.test', password: 'a-long-enough-password' })).status).toBe(202)
  await clients.nonMember.signIn('passer-by@example.test', 'a-long-enough-password')
})
afterAll(async () => {
  await app?.stop()
})

type Actor = 'leaderA' | 'memberA' | 'memberB' | 'nonMember' | 'admin'

describe('group scope', () => {
  // Every group route and every member's data reachable through a group, with what each actor gets.
  const OUT = { memberB: 404, nonMember: 404, admin: 404 } as const
  const ROUTES: { name: string, method: string, path: () => string, body?: () => unknown, expect: Record<Actor, number> }[] = [
    { name: 'group page', method: 'GET', path: () => `/api/groups/${groupA}`, expect: { leaderA: 200, memberA: 200, ...OUT } },
    { name: 'rename', method: 'PATCH', path: () => `/api/groups/${groupA}`, body: () => ({ description: 'Thursdays, after school' }), expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'proposal', method: 'GET', path: () => `/api/groups/${groupA}/proposal?groupSiteId=${siteA}&kind=morning&from=2026-11-25`, expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'add site', method: 'POST', path: () => `/api/groups/${groupA}/sites`, body: () => ({ name: 'Church car park', latitude: 52.61, longitude: -1.64 }), expect: { leaderA: 201, memberA: 403, ...OUT } },
    { name: 'invite', method: 'POST', path: () => `/api/groups/${groupA}/invitations`, body: () => ({ emails: ['someone@example.test'] }), expect: { leaderA: 201, memberA: 403, ...OUT } },
    { name: 'join code', method: 'POST', path: () => `/api/groups/${groupA}/join-code`, body: () => ({ action: 'rotate' }), expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'own reminders', method: 'PATCH', path: () => `/api/groups/${groupA}/membership`, body: () => ({ reminders: false }), expect: { leaderA: 200, memberA: 200, ...OUT } },
    { name: 'new campaign', method: 'POST', path: () => `/api/groups/${groupA}/campaigns`, body: () => ({ title: 'Extra', kind: 'evening', groupSiteId: siteA, nights: [nights[0]], asks: { sketch: true, altitude: false, azimuth: false } }), expect: { leaderA: 201, memberA: 403, ...OUT } },
    { name: 'campaign', method: 'GET', path: () => `/api/campaigns/${campaignA}`, expect: { leaderA: 200, memberA: 200, ...OUT } },
    { name: 'change campaign', method: 'PATCH', path: () => `/api/campaigns/${campaignA}`, body: () => ({ brief: 'Bring the clinometer.' }), expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'grid', method: 'GET', path: () => `/api/campaigns/${campaignA}/grid`, expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'comparison', method: 'GET', path: () => `/api/campaigns/${campaignA}/comparison`, expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'export', method: 'GET', path: () => `/api/campaigns/${campaignA}/export`, expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'member worksheet', method: 'GET', path: () => `/api/campaigns/${campaignA}/members/${memberAId}`, expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'comments', method: 'GET', path: () => `/api/campaigns/${campaignA}/comments`, expect: { leaderA: 200, memberA: 200, ...OUT } },
    { name: 'comment', method: 'POST', path: () => `/api/campaigns/${campaignA}/comments`, body: () => ({ memberId: memberAId, localDate: nights[2], body: 'Good reading.' }), expect: { leaderA: 201, memberA: 403, ...OUT } },
    { name: 'approve', method: 'PATCH', path: () => `/api/groups/${groupA}/members/${memberAId}`, body: () => ({ approve: true }), expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'name co-leader', method: 'PATCH', path: () => `/api/groups/${groupA}/members/${memberAId}`, body: () => ({ role: 'member' }), expect: { leaderA: 200, memberA: 403, ...OUT } },
    { name: 'remove another', method: 'DELETE', path: () => `/api/groups/${groupA}/members/${DEMO_LEADER_ID}`, expect: { leaderA: 409, memberA: 403, ...OUT } },
    { name: 'remove site', method: 'DELETE', path: () => `/api/groups/${groupA}/sites/${siteA}`, expect: { leaderA: 409, memberA: 403, ...OUT } },
  ]
  let DEMO_LEADER_ID = ''

  it.each(ROUTES)('$name: each actor gets what the group allows and nothing more', async (route) => {
    DEMO_LEADER_ID ||= (await leaderA().get(`/api/groups/${groupA}`)).body.members.find((m: { role: string }) => m.role === 'leader').id
    for (const actor of ['memberB', 'nonMember', 'admin', 'memberA', 'leaderA'] as Actor[]) {
      const answer = await clients[actor]!.request(route.method, route.path(), route.body?.() ?? (route.method === 'GET' ? undefined : {}))
      expect(answer.status, `${actor} on ${route.name}: ${JSON.stringify(answer.body).slice(0, 200)}`).toBe(route.expect[actor])
    }
  })

  it('shows members to each other by display name only: no e-mail address, no member\'s own site', async () => {
    const page = await clients.memberA!.get(`/api/groups/${groupA}`)
    const text = JSON.stringify(page.body)
    expect(text).not.toContain('@')
    expect(page.body.joinCode).toBeNull()
    expect(page.body.members.map((m: { name: string }) => m.name).sort()).toEqual([NEWCOMER.name, 'Bram Toller'].sort())
    const comments = await clients.memberA!.get(`/api/campaigns/${campaignA}/comments`)
    expect(JSON.stringify(comments.body)).not.toContain('@')
  })

  it('gives the leader only what was logged at the group site on campaign nights', async () => {
    const grid = await leaderA().get(`/api/campaigns/${campaignA}/grid`)
    const row = grid.body.rows.find((r: { member: { id: string } }) => r.member.id === memberAId)
    expect(row.total).toBe(1)
    expect(row.cells[2].state).toBe('measured')
    expect(row.cells[3].state).toBe('nothing')
    expect(grid.body.queries).toBe(3)
    for (const path of ['grid', 'comparison', 'export', `members/${memberAId}`]) {
      const answer = await leaderA().get(`/api/campaigns/${campaignA}/${path}`)
      const text = typeof answer.body === 'string' ? answer.body : JSON.stringify(answer.body)
      expect(text, path).not.toContain('@')
      expect(text, path).not.toContain('Ada back garden')
      expect(text, path).not.toContain('garden-only note')
      expect(text, path).not.toContain('52.61234')
    }
    const worksheet = await leaderA().get(`/api/campaigns/${campaignA}/members/${memberAId}`)
    expect(worksheet.body.observations).toHaveLength(1)
    expect(worksheet.body.observations[0].localDate).toBe(nights[2])
  })

  it('keeps group B\'s members and work out of group A\'s leader\'s reach', async () => {
    const b = await clients.leaderB!.get(`/api/groups/${groupB}`)
    const pupil = b.body.members.find((m: { name: string }) => m.name === 'Kofi Ashdown')
    expect(pupil).toBeDefined()
    const bCampaign = b.body.campaigns[0].id
    expect((await leaderA().get(`/api/campaigns/${bCampaign}/grid`)).status).toBe(404)
    expect((await leaderA().get(`/api/campaigns/${campaignA}/members/${pupil.id}`)).status).toBe(404)
    expect((await leaderA().post(`/api/campaigns/${campaignA}/comments`, { memberId: pupil.id, localDate: nights[0], body: 'x' })).status).toBe(400)
    // The leader of B reads B's grid; the admin, who leads nothing, does not.
    expect((await clients.leaderB!.get(`/api/campaigns/${bCampaign}/grid`)).status).toBe(200)
    expect((await clients.admin!.get(`/api/campaigns/${bCampaign}/grid`)).status).toBe(404)
  })

  it('a member who leaves keeps their work and the group loses sight of it', async () => {
    const token = await invite('leaver@example.test')
    const leaver = new Client(app.url)
    const joined = await leaver.post('/api/invitations/sign-up', { token, name: 'Leaver', password: 'another-long-password' })
    const id = joined.body.user.id
    const copy = (await leaver.get('/api/sites')).body.find((s: { name: string }) => s.name === 'Village green')
    const logged = await leaver.post('/api/observations', observation(copy.id, nights[1]!))
    expect(logged.status).toBe(201)
    expect((await leaderA().get(`/api/campaigns/${campaignA}/members/${id}`)).status).toBe(200)
    expect((await leaver.request('DELETE', `/api/groups/${groupA}/members/${id}`)).status).toBe(204)
    expect((await leaderA().get(`/api/campaigns/${campaignA}/members/${id}`)).status).toBe(404)
    const grid = await leaderA().get(`/api/campaigns/${campaignA}/grid`)
    expect(grid.body.rows.map((r: { member: { id: string } }) => r.member.id)).not.toContain(id)
    expect((await leaver.get(`/api/observations/${logged.body.id}`)).status).toBe(200)
    expect((await leaver.get(`/api/groups/${groupA}`)).status).toBe(404)
  })
})

describe('invitation and join-code tokens', () => {
  it('an invitation link works once', async () => {
    const users = count('users')
    const again = await new Client(app.url).post('/api/invitations/sign-up', { token: inviteMail, name: 'Twice', password: 'a-long-enough-password' })
    expect(again.status).toBe(400)
    expect(again.body.message).toMatch(/not valid any more/)
    expect(count('users')).toBe(users)
  })

  it('keeps only the link\'s hash', async () => {
    const db = sql()
    try {
      const rows = db.prepare('select token_hash from group_invitations').all() as { token_hash: string }[]
      expect(rows.some(r => r.token_hash === inviteMail)).toBe(false)
      expect(rows.every(r => /^[0-9a-f]{64}$/.test(r.token_hash))).toBe(true)
    }
    finally {
      db.close()
    }
  })

  it('an expired invitation is refused and writes nothing', async () => {
    const token = await invite('late@example.test')
    const db = sql()
    db.prepare('update group_invitations set expires_at = ? where email = ?').run('2020-01-01T00:00:00.000Z', 'late@example.test')
    db.close()
    const users = count('users')
    const answer = await new Client(app.url).post('/api/invitations/sign-up', { token, name: 'Late', password: 'a-long-enough-password' })
    expect(answer.status).toBe(400)
    expect(count('users')).toBe(users)
    expect((await new Client(app.url).get(`/api/invitations/preview?token=${token}`)).status).toBe(400)
  })

  it('a withdrawn invitation is refused; another group\'s leader cannot withdraw it', async () => {
    const token = await invite('withdrawn@example.test')
    const open = (await leaderA().get(`/api/groups/${groupA}`)).body.invitations.find((i: { email: string }) => i.email === 'withdrawn@example.test')
    expect((await clients.leaderB!.request('DELETE', `/api/groups/${groupB}/invitations/${open.id}`)).status).toBe(404)
    expect((await new Client(app.url).get(`/api/invitations/preview?token=${token}`)).status).toBe(200)
    expect((await leaderA().request('DELETE', `/api/groups/${groupA}/invitations/${open.id}`)).status).toBe(204)
    const answer = await new Client(app.url).post('/api/invitations/sign-up', { token, name: 'W', password: 'a-long-enough-password' })
    expect(answer.status).toBe(400)
  })

  it('an invitation sent to one address cannot be accepted by another account', async () => {
    const token = await invite('someone.else@example.test')
    const memberships = count('group_members')
    const answer = await clients.memberB!.post('/api/invitations/accept', { token })
    expect(answer.status).toBe(403)
    expect(count('group_members')).toBe(memberships)
    // Still usable by its addressee.
    expect((await new Client(app.url).get(`/api/invitations/preview?token=${token}`)).status).toBe(200)
  })

  it('joins with the join code, which rotation and switching off make useless', async () => {
    const first = (await leaderA().post(`/api/groups/${groupA}/join-code`, { action: 'rotate' })).body.joinCode as string
    expect(first).toMatch(/^[A-Z2-9]{4}-[A-Z2-9]{4}$/)
    const second = (await leaderA().post(`/api/groups/${groupA}/join-code`, { action: 'rotate' })).body.joinCode as string
    expect(second).not.toBe(first)
    const learner = clients.nonMember!
    const stale = await learner.post('/api/groups/join', { code: first })
    expect(stale.status).toBe(404)
    expect((await learner.get(`/api/groups/${groupA}`)).status).toBe(404)
    const joined = await learner.post('/api/groups/join', { code: second.toLowerCase() })
    expect(joined.status).toBe(200)
    expect(joined.body.status).toBe('active')
    expect((await learner.get(`/api/groups/${groupA}`)).status).toBe(200)
    // The group site arrived among the learner's sites, ready to choose.
    expect((await learner.get('/api/sites')).body.some((s: { name: string, groupSite: boolean }) => s.name === 'Village green' && s.groupSite)).toBe(true)
    await leaderA().post(`/api/groups/${groupA}/join-code`, { action: 'off' })
    expect((await clients.memberB!.post('/api/groups/join', { code: second })).status).toBe(404)
  })

  it('with approval on, a code request waits for the leader and sees nothing meanwhile', async () => {
    const code = (await leaderA().post(`/api/groups/${groupA}/join-code`, { action: 'rotate', approval: true })).body.joinCode as string
    const pupil = clients.memberB!
    const asked = await pupil.post('/api/groups/join', { code })
    expect(asked.body.status).toBe('pending')
    expect((await pupil.get(`/api/groups/${groupA}`)).status).toBe(404)
    expect((await pupil.get(`/api/campaigns/${campaignA}`)).status).toBe(404)
    const page = await leaderA().get(`/api/groups/${groupA}`)
    const waiting = page.body.members.find((m: { status: string }) => m.status === 'pending')
    expect(waiting.name).toBe('Kofi Ashdown')
    expect((await leaderA().patch(`/api/groups/${groupA}/members/${waiting.id}`, { approve: true })).status).toBe(200)
    expect((await pupil.get(`/api/groups/${groupA}`)).status).toBe(200)
  })

  it('answers bad input with a clear 400 and writes nothing', async () => {
    const campaigns = count('campaigns')
    const bad = [
      ['/api/groups/join', { code: 'short' }, /eight letters/],
      [`/api/groups/${groupA}/campaigns`, { title: 'No nights', kind: 'evening', groupSiteId: siteA, nights: [], asks: { sketch: true, altitude: true, azimuth: true } }, /at least one night/],
      [`/api/groups/${groupA}/campaigns`, { title: 'Nothing asked', kind: 'evening', groupSiteId: siteA, nights: [nights[0]], asks: { sketch: false, altitude: false, azimuth: false } }, /at least one of/],
      [`/api/groups/${groupA}/campaigns`, { title: 'Other site', kind: 'evening', groupSiteId: '00000000-0000-4000-8000-000000000000', nights: [nights[0]], asks: { sketch: true, altitude: true, azimuth: true } }, /group's sites/],
      [`/api/groups/${groupA}/invitations`, { emails: ['not an address'] }, /valid e-mail/],
      [`/api/campaigns/${campaignA}/comments`, { memberId: memberAId, localDate: '2026-10-01', body: 'Off the campaign' }, /campaign's nights/],
    ] as const
    for (const [path, body, message] of bad) {
      const answer = await leaderA().post(path, body)
      expect(answer.status, path).toBe(400)
      expect(answer.body.message, path).toMatch(message)
    }
    expect(count('campaigns')).toBe(campaigns)
  })
})
