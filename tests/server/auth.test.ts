import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, linkIn, startApp, waitForMail, type RunningApp } from '../support/app'

let app: RunningApp

beforeAll(async () => {
  app = await startApp()
})
afterAll(async () => {
  await app?.stop()
})

function tokenOf(link: string): string {
  return new URL(link).searchParams.get('token')!
}

describe('sign-up, verification and roles', () => {
  it('takes a new account from learner to observer through the e-mailed link', async () => {
    const client = new Client(app.url)
    const email = 'wren.fieldnotes@example.test'
    const signUp = await client.post('/api/auth/sign-up', { name: 'Wren', email, password: 'long-enough-secret' })
    expect(signUp.status).toBe(202)

    // Before confirming, the account is a learner.
    await client.signIn(email, 'long-enough-secret')
    const before = await client.get('/api/_auth/session')
    expect(before.body.user).toMatchObject({ email, role: 'learner', verified: false })

    const mail = await waitForMail(app.dataDir, email, /Confirm your Shadowline/)
    const link = linkIn(mail.text, '/verify-email')
    expect(link.startsWith(app.url)).toBe(true)
    const verified = await client.post('/api/auth/verify-email', { token: tokenOf(link) })
    expect(verified.status).toBe(200)
    expect(verified.body.role).toBe('observer')

    const after = await client.get('/api/_auth/session')
    expect(after.body.user).toMatchObject({ role: 'observer', verified: true })
    // An observer is still below an administrator.
    expect((await client.get('/api/admin/users')).status).toBe(403)

    // The link works once.
    const again = await new Client(app.url).post('/api/auth/verify-email', { token: tokenOf(link) })
    expect(again.status).toBe(400)
  })

  it('answers a sign-up for a taken address exactly as for a new one, and tells the owner', async () => {
    const client = new Client(app.url)
    const answer = await client.post('/api/auth/sign-up', { name: 'Someone', email: DEMO.observer.email, password: 'another-long-secret' })
    expect(answer.status).toBe(202)
    const fresh = await client.post('/api/auth/sign-up', { name: 'Someone', email: 'nobody.yet@example.test', password: 'another-long-secret' })
    expect(answer.body).toEqual(fresh.body)
    await waitForMail(app.dataDir, DEMO.observer.email, /tried to sign up/)
    // The existing password still works: nothing was changed.
    await client.signIn(DEMO.observer.email, DEMO.observer.password)
  })

  it('refuses bad sign-up input with field messages and creates nothing', async () => {
    const client = new Client(app.url)
    const answer = await client.post('/api/auth/sign-up', { name: '', email: 'not-an-address', password: 'short' })
    expect(answer.status).toBe(400)
    expect(Object.keys(answer.body.data.fields).sort()).toEqual(['email', 'name', 'password'])
    const signIn = await client.post('/api/auth/sign-in', { email: 'not-an-address', password: 'short' })
    expect(signIn.status).toBe(400)
  })
})

describe('sign-in', () => {
  it('gives the same answer for a wrong password and an unknown address', async () => {
    const client = new Client(app.url)
    const wrong = await client.post('/api/auth/sign-in', { email: DEMO.moderator.email, password: 'not-the-password' })
    const unknown = await client.post('/api/auth/sign-in', { email: 'nobody@example.test', password: 'not-the-password' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body.message).toBe(unknown.body.message)
  })

  it('limits failed attempts per account, then refuses even the right password', async () => {
    const client = new Client(app.url)
    for (let i = 0; i < 5; i += 1) {
      expect((await client.post('/api/auth/sign-in', { email: DEMO.learner.email, password: `guess-${i}` })).status).toBe(401)
    }
    const blocked = await client.post('/api/auth/sign-in', DEMO.learner)
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    // Other accounts from the same address are not yet affected (the address limit is higher).
    await client.signIn(DEMO.moderator.email, DEMO.moderator.password)
  })

  it('signs out', async () => {
    const client = new Client(app.url)
    await client.signIn(DEMO.admin.email, DEMO.admin.password)
    expect((await client.get('/api/admin/users')).status).toBe(200)
    await client.post('/api/auth/sign-out')
    expect((await client.get('/api/admin/users')).status).toBe(401)
  })
})

describe('password reset', () => {
  it('resets by a single-use e-mailed link and retires the old password', async () => {
    const client = new Client(app.url)
    const email = 'reset.me@example.test'
    await client.post('/api/auth/sign-up', { name: 'Reset Me', email, password: 'first-password-1' })

    const unknown = await client.post('/api/auth/forgot-password', { email: 'no-such-account@example.test' })
    const known = await client.post('/api/auth/forgot-password', { email })
    expect(known.status).toBe(202)
    expect(known.body).toEqual(unknown.body)

    const mail = await waitForMail(app.dataDir, email, /new Shadowline password/)
    const token = tokenOf(linkIn(mail.text, '/reset-password'))
    const tooShort = await client.post('/api/auth/reset-password', { token, password: 'short' })
    expect(tooShort.status).toBe(400)
    const reset = await client.post('/api/auth/reset-password', { token, password: 'second-password-2' })
    expect(reset.status).toBe(200)
    expect((await client.post('/api/auth/reset-password', { token, password: 'third-password-3' })).status).toBe(400)

    expect((await client.post('/api/auth/sign-in', { email, password: 'first-password-1' })).status).toBe(401)
    const signedIn = await client.signIn(email, 'second-password-2')
    // Opening the e-mailed link also proved the address.
    expect(signedIn.body.user).toMatchObject({ verified: true, role: 'observer' })
    await waitForMail(app.dataDir, email, /password was changed/)
  })
})

describe('administration', () => {
  it('lets an admin change a role, which takes effect at once, and records it', async () => {
    const admin = new Client(app.url)
    await admin.signIn(DEMO.admin.email, DEMO.admin.password)
    const observer = new Client(app.url)
    await observer.signIn(DEMO.observer.email, DEMO.observer.password)
    expect((await observer.get('/api/admin/users')).status).toBe(403)

    const list = await admin.get('/api/admin/users?q=fenwright')
    expect(list.body.total).toBe(1)
    const id = list.body.items[0].id
    expect((await admin.patch(`/api/admin/users/${id}`, { role: 'admin' })).status).toBe(200)
    // The observer's existing session sees the new role without signing in again.
    expect((await observer.get('/api/admin/users')).status).toBe(200)
    expect((await admin.patch(`/api/admin/users/${id}`, { role: 'observer' })).status).toBe(200)
    expect((await observer.get('/api/admin/users')).status).toBe(403)

    expect((await admin.patch(`/api/admin/users/${id}`, { role: 'overlord' })).status).toBe(400)
    expect((await admin.patch('/api/admin/users/not-a-uuid', { role: 'observer' })).status).toBe(400)
    expect((await admin.patch('/api/admin/users/00000000-0000-4000-8000-000000000000', { role: 'observer' })).status).toBe(404)
    const self = (await admin.get('/api/_auth/session')).body.user.id
    expect((await admin.patch(`/api/admin/users/${self}`, { role: 'learner' })).status).toBe(409)
  })

  it('disables an account: its session stops working and it cannot sign in', async () => {
    const admin = new Client(app.url)
    await admin.signIn(DEMO.admin.email, DEMO.admin.password)
    const user = new Client(app.url)
    await user.post('/api/auth/sign-up', { name: 'Short Stay', email: 'short.stay@example.test', password: 'short-stay-password' })
    await user.signIn('short.stay@example.test', 'short-stay-password')
    const id = (await admin.get('/api/admin/users?q=short.stay')).body.items[0].id
    expect((await admin.patch(`/api/admin/users/${id}`, { disabled: true })).status).toBe(200)
    expect((await user.post('/api/auth/resend-verification')).status).toBe(401)
    expect((await user.post('/api/auth/sign-in', { email: 'short.stay@example.test', password: 'short-stay-password' })).status).toBe(401)
  })
})
