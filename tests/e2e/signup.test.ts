import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { linkIn, startApp, waitForMail, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'

let app: RunningApp
let browser: Browser

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

describe('a newcomer joins', () => {
  it('signs up, confirms by the caught e-mail, signs in and sees the observer home page', async () => {
    const page = await browser.newPage({ viewport: { width: 1180, height: 820 } })
    const email = 'orla.tidewell@example.test'

    await openReady(page, `${app.url}/sign-up`)
    await page.getByLabel('Name shown to your group').fill('Orla Tidewell')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill('a-clear-night-sky')
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.getByText('We sent a link').waitFor()

    const mail = await waitForMail(app.dataDir, email, /Confirm your Shadowline/)
    await openReady(page, linkIn(mail.text, '/verify-email'))
    await page.getByText('Your address is confirmed.').waitFor()

    await openReady(page, `${app.url}/sign-in`)
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password').fill('a-clear-night-sky')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByText('Welcome back, Orla Tidewell.').waitFor()

    const header = page.getByRole('banner')
    expect(await header.getByText('Observer', { exact: true }).isVisible()).toBe(true)
    expect(await page.getByRole('link', { name: 'Accounts' }).count()).toBe(0)
    await page.screenshot({ path: artifact('home-observer.png'), fullPage: true })

    // Night mode is one tap and survives a reload.
    await page.getByRole('button', { name: /Night/ }).click()
    await page.reload()
    expect(await page.evaluate(() => document.documentElement.classList.contains('night'))).toBe(true)
    await page.screenshot({ path: artifact('home-observer-night.png'), fullPage: true })
    await page.close()
  })

  it('keeps signed-out visitors out of the admin pages, on the page and on the server', async () => {
    const page = await browser.newPage()
    await openReady(page, `${app.url}/admin/users`)
    await page.waitForURL(/\/sign-in\?next=/)
    const api = await page.request.get(`${app.url}/api/admin/users`)
    expect(api.status()).toBe(401)
    await page.close()
  })

  it('shows an administrator the accounts and the caught mail', async () => {
    const page = await browser.newPage({ viewport: { width: 1024, height: 768 } })
    await openReady(page, `${app.url}/sign-in?next=/admin/users`)
    await page.getByLabel('E-mail').fill('admin@shadowline.test')
    await page.getByLabel('Password').fill('moonlit-admin')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('heading', { name: 'Accounts' }).waitFor()
    await page.getByRole('cell', { name: 'Idris Fenwright' }).waitFor()
    await page.screenshot({ path: artifact('admin-accounts.png'), fullPage: true })
    await page.getByRole('link', { name: 'Caught mail' }).click()
    await page.getByRole('heading', { name: 'Caught mail' }).waitFor()
    await page.screenshot({ path: artifact('admin-mail.png'), fullPage: true })
    await page.close()
  })
})
