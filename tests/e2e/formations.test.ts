// Standard names on the sketch desk: pin the place of a known crater, take the suggested IAU name with one
// tap, see the label layer in night mode, and find the published sketch from the formation's page and the
// atlas filter.

import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { lunarCircumstances, selenographicToDisk } from '../../shared/lunar'
import { DISK_RADIUS, SKETCH_SIZE } from '../../shared/sketch/frame'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'
import { savedSketch } from '../support/sketches'

let app: RunningApp
let browser: Browser
let context: BrowserContext
let observer: Client
let sketchId: string

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
  const nights = (await observer.get('/api/observations?perPage=50&sort=observedAt&dir=asc')).body.items
  // A night of the demo lunation that has no sketch yet, saved once so that it can be submitted.
  for (const night of [...nights].reverse()) {
    const id = await savedSketch(app.url, observer, night.id).catch(() => null)
    if (id) {
      sketchId = id
      break
    }
  }
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

describe('standard names on the sketch desk', () => {
  it('pins Copernicus, takes the suggested name, and finds the sketch from the formation\'s page and the atlas', async () => {
    const detail = (await observer.get(`/api/sketches/${sketchId}`)).body
    const c = lunarCircumstances(new Date(detail.observation.observedAt), detail.observation.site)
    // Copernicus: IAU/USGS Gazetteer of Planetary Nomenclature (values from memory) 9.6° N, 20.1° W.
    const disk = selenographicToDisk(9.62, -20.08, c, detail.view)!

    const page = await context.newPage()
    await openReady(page, `${app.url}/sketches/${sketchId}`)
    const canvas = page.getByTestId('sketch-canvas')
    await canvas.waitFor()
    const box = (await canvas.boundingBox())!
    // At zoom 1 the sketch frame fills 96 % of the canvas's shorter side, centred (useSketchViewport).
    const pxPerUnit = Math.min(box.width, box.height) / SKETCH_SIZE * 0.96
    const at = { x: box.x + box.width / 2 + disk.x * DISK_RADIUS * pxPerUnit, y: box.y + box.height / 2 - disk.y * DISK_RADIUS * pxPerUnit }
    await page.getByRole('button', { name: /Name a place/ }).click()
    await page.mouse.click(at.x, at.y)
    const dialog = page.getByRole('dialog', { name: 'Name this place' })
    const suggestions = dialog.getByTestId('formation-suggestions')
    await suggestions.getByRole('button').first().waitFor()
    expect(await suggestions.getByRole('button').first().textContent()).toMatch(/^\s*Copernicus/)
    await page.screenshot({ path: artifact('formation-suggestions.png') })
    await suggestions.getByRole('button', { name: /^Copernicus/ }).click()
    await page.getByRole('link', { name: 'Copernicus' }).first().waitFor()
    const tags = (await observer.get(`/api/sketches/${sketchId}/tags`)).body
    expect(tags.map((t: any) => t.feature.name)).toEqual(['Copernicus'])
    // The pin lands within the crater's 48 km radius (about 1.6°) of its centre.
    expect(Math.hypot(tags[0].latitude - 9.62, (tags[0].longitude + 20.08) * Math.cos(9.6 * Math.PI / 180))).toBeLessThan(1.6)

    // The label layer, off by default, in night mode.
    await page.getByTestId('formation-labels-toggle').check()
    await page.getByRole('button', { name: /Night/ }).first().click()
    await page.waitForFunction(() => document.documentElement.classList.contains('night'))
    expect(await page.getByTestId('terminator-formations').getByRole('listitem').count()).toBeGreaterThan(0)
    await page.screenshot({ path: artifact('formation-labels-night.png') })
    await page.getByRole('button', { name: /Night/ }).first().click()

    // Published, it is found from the formation's page and from the atlas filter.
    await observer.post(`/api/entries/${sketchId}/submit`)
    const moderator = new Client(app.url)
    await moderator.signIn(DEMO.moderator.email, DEMO.moderator.password)
    expect((await moderator.post(`/api/entries/${sketchId}/decision`, { decision: 'approve' })).status).toBe(200)

    await openReady(page, `${app.url}/formations/copernicus`)
    await page.getByRole('heading', { name: 'Copernicus', level: 1 }).waitFor()
    await page.getByTestId('formation-entries').locator(`a[href="/atlas/${sketchId}"]`).waitFor()
    await page.screenshot({ path: artifact('formation-page.png'), fullPage: true })
    await page.getByRole('link', { name: 'In the atlas' }).click()
    await page.waitForURL(/formation=copernicus/)
    await page.locator(`a[href="/atlas/${sketchId}"]`).waitFor()
    // The filter shows the formation once the list of names has arrived.
    await page.waitForFunction(() => document.querySelector<HTMLSelectElement>('[data-testid="formation-select"]')?.value === 'copernicus')
    expect(await page.getByTestId('formation-select').inputValue()).toBe('copernicus')
    await page.screenshot({ path: artifact('atlas-by-formation.png'), fullPage: true })
    await page.close()
  })
})
