// Naming a place on the sketch desk: pin a new feature on one night's sketch, find it on its feature page,
// and see it over another night's sketch once a moderator has confirmed it.

import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'

let app: RunningApp
let browser: Browser
let context: BrowserContext
let observer: Client
let firstNight: string
let otherNight: string

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
  const nights = (await observer.get('/api/observations?perPage=50&sort=observedAt&dir=asc')).body.items
  firstNight = (await observer.post('/api/sketches', { observationId: nights[1].id })).body.id
  otherNight = (await observer.post('/api/sketches', { observationId: nights[5].id })).body.id
  context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  const page = await context.newPage()
  await openReady(page, `${app.url}/sign-in`)
  await page.getByLabel('E-mail').fill(DEMO.observer.email)
  await page.getByLabel('Password').fill(DEMO.observer.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(url => !url.pathname.startsWith('/sign-in'))
  await page.close()
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

describe('features on the sketch desk', () => {
  it('pins a new name, shows it on its feature page and over another night once confirmed', async () => {
    const page = await context.newPage()
    await openReady(page, `${app.url}/sketches/${firstNight}`)
    const canvas = page.getByTestId('sketch-canvas')
    await canvas.waitFor()
    await page.getByRole('button', { name: /Name a place/ }).click()
    const box = (await canvas.boundingBox())!
    // A tap near the middle of the disk.
    await page.mouse.click(box.x + box.width / 2 + 20, box.y + box.height / 2 - 10)
    const dialog = page.getByRole('dialog', { name: 'Name this place' })
    await dialog.getByLabel('Feature name').fill('Fenwright hollow')
    await dialog.getByRole('button', { name: 'Use the new name “Fenwright hollow”' }).click()
    await page.getByRole('link', { name: 'Fenwright hollow' }).waitFor()
    await page.screenshot({ path: artifact('sketch-pin.png') })

    // Beyond the limb nothing is asked: the corner of the canvas is sky.
    await page.mouse.click(box.x + 8, box.y + 8)
    await page.getByText('beyond the limb').waitFor()
    expect(await page.getByRole('dialog').count()).toBe(0)

    await page.getByRole('link', { name: 'Fenwright hollow' }).click()
    await page.getByRole('heading', { name: 'Fenwright hollow' }).waitFor()
    expect(await page.getByText(/mean of 1 pins/).count()).toBe(1)
    const featureId = page.url().split('/').pop()!

    const moderator = new Client(app.url)
    await moderator.signIn(DEMO.moderator.email, DEMO.moderator.password)
    expect((await moderator.patch(`/api/features/${featureId}`, { status: 'confirmed' })).status).toBe(200)

    await openReady(page, `${app.url}/sketches/${otherNight}`)
    await page.getByTestId('sketch-canvas').waitFor()
    await page.getByLabel('Show the gazetteer\'s features').check()
    await page.getByTestId('overlay-features').getByRole('link', { name: 'Fenwright hollow' }).waitFor()
    await page.screenshot({ path: artifact('sketch-overlay.png') })
    await page.close()
  })

  it('lets the keyboard pin the middle of the view', async () => {
    const page = await context.newPage()
    await openReady(page, `${app.url}/sketches/${otherNight}`)
    await page.getByTestId('sketch-canvas').waitFor()
    await page.getByRole('button', { name: 'pin the centre' }).focus()
    await page.keyboard.press('Enter')
    const dialog = page.getByRole('dialog', { name: 'Name this place' })
    await dialog.getByLabel('Feature name').fill('fenwright hol')
    await dialog.getByRole('button', { name: /^Fenwright hollow/ }).click()
    await page.getByRole('link', { name: 'Fenwright hollow' }).first().waitFor()
    const tags = (await observer.get(`/api/sketches/${otherNight}/tags`)).body
    expect(tags.map((t: any) => t.feature.name)).toEqual(['Fenwright hollow'])
    // Two nights' pins of one place: the feature now averages both.
    const feature = (await observer.get(`/api/features/${tags[0].feature.id}`)).body.feature
    expect(feature.pinCount).toBe(2)
    await page.close()
  })
})
