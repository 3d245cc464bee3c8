import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, linkIn, startApp, waitForMail, type RunningApp } from '../support/app'

let app: RunningApp

beforeAll(async () => {
  app = await startApp()
})
afterAll(async () => {
  await app?.stop()
})

/** A second browser with a copy of this one's cookie. */
function copyOf(client: Client): Client {
  const copy = new Client(app.url)
  ;(copy as unknown as { cookies: Map<string, string> }).cookies = new Map(
    client.cookieHeader().split('; ').map((pair) => {
      const at = pair.indexOf('=')
      return [pair.slice(0, at), pair.slice(at + 1)] as [string, string]
    }),
  )
  return copy
}

async function newAccount(email: string, password: string): Promise<void> {
  expect((await new Client(app.url).post('/api/auth/sign-up', { name: 'Rowan', email, password })).status).toBe(202)
}

describe('sessions end on the server', () => {
  it('makes a cookie replayed after sign-out worthless', async () => {
    const browser = new Client(app.url)
    await browser.signIn(DEMO.observer.email, DEMO.observer.password)
    const stolen = copyOf(browser)
    expect((await stolen.get('/api/sites')).status).toBe(200)
    expect((await browser.post('/api/auth/sign-out')).status).toBe(200)
    expect((await stolen.get('/api/sites')).status).toBe(401)
    expect((await stolen.get('/api/_auth/session')).body.user).toBeUndefined()
  })

  it('signs out every device of the account, and only that account', async () => {
    const phone = new Client(app.url)
    const laptop = new Client(app.url)
    const other = new Client(app.url)
    await phone.signIn(DEMO.learner.email, DEMO.learner.password)
    await laptop.signIn(DEMO.learner.email, DEMO.learner.password)
    await other.signIn(DEMO.moderator.email, DEMO.moderator.password)
    expect((await phone.post('/api/auth/sign-out-everywhere')).status).toBe(200)
    expect((await laptop.get('/api/sites')).status).toBe(401)
    expect((await phone.get('/api/sites')).status).toBe(401)
    expect((await other.get('/api/sites')).status).toBe(200)
  })

  it('ends every session when the password is reset from the e-mailed link', async () => {
    const email = 'rowan.reset@example.test'
    await newAccount(email, 'first-long-password')
    const copied = new Client(app.url)
    await copied.signIn(email, 'first-long-password')
    expect((await new Client(app.url).post('/api/auth/forgot-password', { email })).status).toBe(202)
    const mail = await waitForMail(app.dataDir, email, /Choose a new Shadowline password/)
    const token = new URL(linkIn(mail.text, '/reset-password')).searchParams.get('token')
    expect((await new Client(app.url).post('/api/auth/reset-password', { token, password: 'second-long-password' })).status).toBe(200)
    expect((await copied.get('/api/sites')).status).toBe(401)
  })

  it('ends the other sessions, not this one, when the password is changed', async () => {
    const email = 'rowan.change@example.test'
    await newAccount(email, 'first-long-password')
    const here = new Client(app.url)
    const elsewhere = new Client(app.url)
    await here.signIn(email, 'first-long-password')
    await elsewhere.signIn(email, 'first-long-password')
    const wrong = await here.post('/api/auth/password', { currentPassword: 'not-it-at-all', password: 'second-long-password' })
    expect(wrong.status).toBe(400)
    expect((await elsewhere.get('/api/sites')).status).toBe(200)
    expect((await here.post('/api/auth/password', { currentPassword: 'first-long-password', password: 'second-long-password' })).status).toBe(200)
    expect((await here.get('/api/sites')).status).toBe(200)
    expect((await elsewhere.get('/api/sites')).status).toBe(401)
    await new Client(app.url).signIn(email, 'second-long-password')
  })

  it('sends the cookie without Secure on plain http, so sign-in works on a club\'s LAN address', async () => {
    const answer = await new Client(app.url).post('/api/auth/sign-in', DEMO.observer)
    const cookie = answer.headers.getSetCookie().find(c => c.startsWith('shadowline-session='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).not.toMatch(/;\s*Secure/i)
  })
})

describe('sign-in limits', () => {
  it('counts the socket\'s address, not a forged X-Forwarded-For, when no proxy is trusted', async () => {
    const forged = '198.51.100.23'
    const answer = await new Client(app.url).request('POST', '/api/auth/sign-in', { email: 'nobody.here@example.test', password: 'wrong-guess' }, { 'x-forwarded-for': forged })
    expect(answer.status).toBe(401)
    const db = new Database(join(app.dataDir, 'shadowline.sqlite'))
    try {
      const keys = db.prepare('select key from signin_failures where scope = ?').all('address') as { key: string }[]
      expect(keys.map(k => k.key)).not.toContain(forged)
      expect(keys.length).toBeGreaterThan(0)
    }
    finally {
      db.close()
    }
  })
})

describe('requests from other sites and form encodings', () => {
  it('refuses a form-encoded sign-in, as a page elsewhere would send it', async () => {
    const answer = await fetch(`${app.url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ email: DEMO.observer.email, password: DEMO.observer.password }),
    })
    expect(answer.status).toBe(415)
    expect(answer.headers.getSetCookie()).toEqual([])
  })

  it('refuses JSON from another origin or another site, and takes it from the site itself', async () => {
    const client = new Client(app.url)
    const cross = await client.request('POST', '/api/auth/sign-in', DEMO.observer, { origin: 'https://elsewhere.example' })
    expect(cross.status).toBe(403)
    const site = await client.request('POST', '/api/auth/sign-in', DEMO.observer, { 'sec-fetch-site': 'cross-site' })
    expect(site.status).toBe(403)
    const own = await client.request('POST', '/api/auth/sign-in', DEMO.observer, { 'origin': app.url, 'sec-fetch-site': 'same-origin' })
    expect(own.status).toBe(200)
  })
})

describe('answers', () => {
  it('gives a 4xx its own status text, not "Server Error"', async () => {
    const answer = await new Client(app.url).get('/api/sites')
    expect(answer.status).toBe(401)
    expect(answer.body.statusMessage).toBe('Unauthorized')
    const missing = await new Client(app.url).get('/api/atlas/00000000-0000-4000-8000-000000000000')
    expect(missing.body.statusMessage).toBe('Not Found')
  })

  it('sends pages with a Content-Security-Policy and without x-powered-by', async () => {
    const page = await fetch(`${app.url}/atlas`)
    expect(page.status).toBe(200)
    expect(page.headers.get('x-powered-by')).toBeNull()
    const policy = page.headers.get('content-security-policy') ?? ''
    expect(policy).toMatch(/default-src 'self'/)
    expect(policy).toMatch(/frame-ancestors 'none'/)
    expect(policy).toMatch(/object-src 'none'/)
  })

  it('answers forgot-password for a known address before doing the work, exactly as for an unknown one', async () => {
    const known = await new Client(app.url).post('/api/auth/forgot-password', { email: DEMO.learner.email })
    const unknown = await new Client(app.url).post('/api/auth/forgot-password', { email: 'no.such.person@example.test' })
    expect(known.status).toBe(202)
    expect(known.body).toEqual(unknown.body)
    // The work still happens, after the answer.
    await waitForMail(app.dataDir, DEMO.learner.email, /Choose a new Shadowline password/)
  })
})

describe('behind a proxy', () => {
  let proxied: RunningApp
  beforeAll(async () => {
    proxied = await startApp({ NUXT_TRUSTED_PROXIES: 'loopback', NUXT_PUBLIC_SITE_URL: '' })
  })
  afterAll(async () => {
    await proxied?.stop()
  })

  it('blocks the guessing address without locking the owner out from their own', async () => {
    const attacker = { 'x-forwarded-for': '203.0.113.50' }
    const owner = { 'x-forwarded-for': '198.51.100.7' }
    const client = new Client(proxied.url)
    for (let i = 0; i < 5; i += 1) {
      const guess = await client.request('POST', '/api/auth/sign-in', { email: DEMO.observer.email, password: `guess-${i}` }, attacker)
      expect(guess.status).toBe(401)
    }
    const sixth = await client.request('POST', '/api/auth/sign-in', { email: DEMO.observer.email, password: 'guess-6' }, attacker)
    expect(sixth.status).toBe(429)
    expect(Number(sixth.headers.get('retry-after'))).toBeGreaterThan(0)
    const mine = await new Client(proxied.url).request('POST', '/api/auth/sign-in', DEMO.observer, owner)
    expect(mine.status).toBe(200)
  })

  it('marks the cookie Secure when the proxy says the browser came over https', async () => {
    const answer = await new Client(proxied.url).request('POST', '/api/auth/sign-in', DEMO.learner, { 'x-forwarded-proto': 'https', 'x-forwarded-for': '198.51.100.8' })
    expect(answer.status).toBe(200)
    expect(answer.headers.getSetCookie().find(c => c.startsWith('shadowline-session='))).toMatch(/;\s*Secure/i)
  })
})

describe('plain http beyond this machine', () => {
  it('warns at start-up', async () => {
    const lan = await startApp({ NUXT_PUBLIC_SITE_URL: 'http://moonwatch-club.lan:3000' })
    try {
      expect(lan.output()).toMatch(/plain http.*unencrypted/)
    }
    finally {
      await lan.stop()
    }
  })
})
