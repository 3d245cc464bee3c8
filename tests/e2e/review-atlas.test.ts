import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, caughtMail, startApp, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'
import { savedSketch } from '../support/sketches'

let app: RunningApp
let browser: Browser
let sketchId: string
let phaseName: string
let colongitude: number

async function signedIn(role: 'observer' | 'moderator'): Promise<{ context: BrowserContext, page: Page }> {
  const context = await browser.newContext({ viewport: { width: 1180, height: 820 } })
  const page = await context.newPage()
  await openReady(page, `${app.url}/sign-in`)
  await page.getByLabel('E-mail').fill(DEMO[role].email)
  await page.getByLabel('Password').fill(DEMO[role].password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.getByText('Welcome back').waitFor()
  return { context, page }
}

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  // The drawing itself is the sketch desk's test; here a saved sketch of a demo observation is the start.
  const observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
  const observation = (await observer.get('/api/observations?perPage=1&sort=observedAt&dir=asc')).body.items[0]
  phaseName = observation.circumstances.phaseName
  colongitude = observation.circumstances.colongitudeDeg
  sketchId = await savedSketch(app.url, observer, observation.id)
  await observer.post(`/api/sketches/${sketchId}/tags`, { x: 0.05, y: 0.1, name: 'Lamplight bay' })
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

describe('from the eyepiece to the atlas', () => {
  it('is submitted, returned with a comment, resubmitted, approved, and found in the atlas by phase and lighting', async () => {
    const observer = await signedIn('observer')
    const moderator = await signedIn('moderator')

    await openReady(observer.page, `${app.url}/entries`)
    const entry = observer.page.locator(`[data-entry="${sketchId}"]`)
    // The saved sketch is shown over the outline of its disk, not as strokes on black.
    expect(await entry.locator('img').first().evaluate(img => getComputedStyle(img).backgroundImage)).toMatch(/radial-gradient/)
    await entry.getByRole('button', { name: 'Submit for review' }).click()
    await entry.getByText('Waiting for review').waitFor()

    await openReady(moderator.page, `${app.url}/review`)
    const row = moderator.page.locator(`[data-entry="${sketchId}"]`)
    await row.getByRole('link', { name: 'Idris Fenwright' }).waitFor()
    await moderator.page.screenshot({ path: artifact('review-queue.png'), fullPage: true })
    await row.getByRole('link', { name: 'Idris Fenwright' }).click()
    await moderator.page.getByRole('heading', { name: 'Decision' }).waitFor()
    expect(await moderator.page.getByRole('link', { name: 'Lamplight bay' }).count()).toBe(1)
    // The view in words, the sketch over the disk's outline, and the pin on the sketch where it was placed.
    expect(await moderator.page.getByTestId('review-view').textContent()).toBe('sky view (zenith up), upright')
    expect(await moderator.page.getByTestId('review-sketch').locator('circle').count()).toBe(1)
    const pin = moderator.page.getByTestId('review-pin')
    expect(await pin.count()).toBe(1)
    expect(await pin.textContent()).toContain('Lamplight bay')
    // Placed at disk (0.05, 0.1): just right of and above the centre of the sketch (frame: radius 860 of 2048).
    const frame = (await moderator.page.getByTestId('review-sketch').boundingBox())!
    const dot = (await pin.locator('span').first().boundingBox())!
    const cx = (dot.x + dot.width / 2 - frame.x) / frame.width
    const cy = (dot.y + dot.height / 2 - frame.y) / frame.height
    expect(cx).toBeCloseTo(0.5 + 0.05 * 860 / 2048, 2)
    expect(cy).toBeCloseTo(0.5 - 0.1 * 860 / 2048, 2)
    await moderator.page.getByLabel('Comment for the observer').fill('Please mark the terminator where it crosses the crater floors.')
    await moderator.page.screenshot({ path: artifact('review-desk.png'), fullPage: true })
    await moderator.page.getByRole('button', { name: 'Return with comments' }).click()
    await moderator.page.getByText('Returned with comments', { exact: true }).first().waitFor()

    await observer.page.reload()
    await entry.getByText('Please mark the terminator where it crosses the crater floors.').waitFor()
    await entry.getByRole('button', { name: 'Submit again' }).click()
    await entry.getByText('Waiting for review').waitFor()

    await openReady(moderator.page, `${app.url}/review/${sketchId}`)
    await moderator.page.getByRole('button', { name: 'Approve into the atlas' }).click()
    await moderator.page.getByText('In the atlas', { exact: true }).first().waitFor()
    // The observer's entry now leads to its published atlas page.
    await observer.page.reload()
    expect(await entry.getByRole('link', { name: 'See it in the atlas' }).getAttribute('href')).toBe(`/atlas/${sketchId}`)

    const visitor = await browser.newPage({ viewport: { width: 1180, height: 820 } })
    await openReady(visitor, `${app.url}/atlas?phase=${phaseName}`)
    await visitor.locator(`a[href="/atlas/${sketchId}"]`).first().waitFor()
    const lo = Math.max(0, Math.floor(colongitude - 2))
    await openReady(visitor, `${app.url}/atlas?colongitudeMin=${lo}&colongitudeMax=${Math.min(360, lo + 4)}`)
    await visitor.locator(`a[href="/atlas/${sketchId}"]`).first().waitFor()
    // Filters set with the controls land in the URL, so the view can be shared.
    await openReady(visitor, `${app.url}/atlas`)
    await visitor.getByLabel('Phase').selectOption(phaseName)
    await visitor.waitForURL(new RegExp(`phase=${phaseName}`))
    await visitor.locator(`a[href="/atlas/${sketchId}"]`).first().waitFor()
    await visitor.screenshot({ path: artifact('atlas.png'), fullPage: true })
    // The panel offers feature and observer, as the API does.
    await openReady(visitor, `${app.url}/atlas`)
    await visitor.getByLabel('Feature').selectOption({ label: 'Lamplight bay' })
    await visitor.waitForURL(/feature=[0-9a-f-]{36}/)
    await visitor.locator(`a[href="/atlas/${sketchId}"]`).first().waitFor()
    await visitor.getByLabel('Observer').selectOption({ label: 'Idris Fenwright' })
    await visitor.waitForURL(/observer=[0-9a-f-]{36}/)
    await visitor.locator(`a[href="/atlas/${sketchId}"]`).first().waitFor()
    // A bad range is said in words, not as the request that failed.
    await openReady(visitor, `${app.url}/atlas?colongitudeMin=400&colongitudeMax=10`)
    await visitor.getByText(/Colongitude runs from 0° to 360°/).waitFor()
    expect(await visitor.locator('main').textContent()).not.toMatch(/\[GET\]|Validation Error/)
    await openReady(visitor, `${app.url}/atlas?phase=${phaseName}`)
    await visitor.locator(`a[href="/atlas/${sketchId}"]`).first().click()
    await visitor.getByRole('heading', { name: 'Features pinned' }).waitFor()
    expect(await visitor.getByRole('img', { name: /^Sketch by/ }).evaluate(img => getComputedStyle(img).backgroundImage)).toMatch(/radial-gradient/)
    await visitor.getByRole('link', { name: 'Lamplight bay' }).waitFor()
    expect(await visitor.getByText(/% of the disk is lit/).count()).toBe(1)
    await visitor.screenshot({ path: artifact('atlas-entry.png'), fullPage: true })
    await visitor.getByRole('link', { name: 'Lamplight bay' }).click()
    await visitor.getByRole('heading', { name: 'Lamplight bay' }).waitFor()
    await visitor.screenshot({ path: artifact('feature-page.png'), fullPage: true })

    const deadline = Date.now() + 15_000
    let subjects: string[] = []
    while (Date.now() < deadline && subjects.length < 2) {
      subjects = (await caughtMail(app.dataDir))
        .filter(m => m.to.includes(DEMO.observer.email) && /Your sketch/.test(m.subject))
        .map(m => m.subject)
      if (subjects.length < 2) await new Promise(r => setTimeout(r, 100))
    }
    expect(subjects.sort()).toEqual(['Your sketch is in the atlas', 'Your sketch was returned with comments'])
    await observer.context.close()
    await moderator.context.close()
  })

  it('explains the phase for a chosen date', async () => {
    const page = await browser.newPage({ viewport: { width: 1180, height: 820 } })
    await openReady(page, `${app.url}/learn`)
    await page.getByLabel('Date').fill('2026-11-17')
    await page.getByText(/First quarter|Waxing/).first().waitFor()
    await page.screenshot({ path: artifact('learn.png'), fullPage: true })
    await page.close()
  })
})
