import { readFileSync } from 'node:fs'
import sharp from 'sharp'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO, startApp, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'

let app: RunningApp
let browser: Browser
let page: Page

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  // A 10-inch tablet in landscape.
  page = await browser.newPage({ viewport: { width: 1280, height: 800 } })
  await openReady(page, `${app.url}/sign-in`)
  await page.getByLabel('E-mail').fill(DEMO.observer.email)
  await page.getByLabel('Password').fill(DEMO.observer.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.getByText('Welcome back').waitFor()
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

describe('an observing night', () => {
  it('plans tonight with the cautions, the evening plot and the lunation evenings', async () => {
    await openReady(page, `${app.url}/tonight?date=2026-11-16`)
    await page.getByRole('heading', { name: 'Through the evening' }).waitFor()
    await page.locator('canvas').first().waitFor()
    expect(await page.getByLabel('Observing safely').count()).toBeGreaterThan(0)
    expect(await page.getByText('start the series here').count()).toBe(1)
    await page.screenshot({ path: artifact('tonight.png'), fullPage: true })
  })

  it('logs an observation with both measurements and shows predicted values and residuals', async () => {
    await openReady(page, `${app.url}/observations/new`)
    await page.getByLabel('Date at the site').fill('2026-11-18')
    await page.getByLabel(/^Time at the site/).fill('18:30')
    await page.getByText('Binoculars', { exact: true }).click()
    await page.getByLabel('Magnification (the 10 in 10 × 42)').fill('10')
    await page.getByLabel('Aperture in mm (the 42 in 10 × 42)').fill('42')
    await page.getByLabel('Seeing (Antoniadi scale)').selectOption('2')
    await page.getByLabel('Clinometer reading (°)').fill('60')
    await page.getByLabel('Compass bearing (° magnetic)').fill('175')
    // The residuals appear as the readings are typed, before saving.
    await page.getByTestId('altitude-result').waitFor()
    expect(await page.getByTestId('altitude-result').textContent()).toContain('Altitude 30.0°')
    await page.screenshot({ path: artifact('observation-form.png'), fullPage: true })
    await page.getByRole('button', { name: 'Save observation' }).click()
    await page.waitForURL(/\/observations\/[0-9a-f-]{36}$/)
    const table = page.getByRole('table')
    await table.getByText('Altitude (clinometer)').waitFor()
    const altitudeRow = await table.getByRole('row', { name: /Altitude/ }).textContent()
    expect(altitudeRow).toMatch(/60\.0°\s*30\.0°\s*\d+\.\d°\s*[+−]\d+\.\d°/)
    const azimuthRow = await table.getByRole('row', { name: /Azimuth/ }).textContent()
    expect(azimuthRow).toMatch(/175\.0° magnetic/)
    await page.screenshot({ path: artifact('observation-detail.png'), fullPage: true })
  })

  it('opens the lunation worksheet with its plots, table and compass offset, and prints cleanly', async () => {
    await openReady(page, `${app.url}/observations`)
    await page.getByRole('link', { name: /2026-11-18/ }).click()
    await page.getByRole('link', { name: 'Lunation worksheet' }).click()
    await page.getByRole('heading', { name: 'Lunation worksheet' }).waitFor()
    await page.getByRole('heading', { name: 'Azimuth night by night' }).waitFor()
    expect(await page.locator('canvas').count()).toBe(2)
    expect(await page.getByText('Estimated constant compass offset').count()).toBe(1)
    await page.screenshot({ path: artifact('worksheet.png'), fullPage: true })
    await page.emulateMedia({ media: 'print' })
    await page.screenshot({ path: artifact('worksheet-print.png'), fullPage: true })
    await page.emulateMedia({ media: 'screen' })
  })

  it('exports the list as CSV with a header and one row per observation', async () => {
    await openReady(page, `${app.url}/observations`)
    const total = Number((await page.getByText(/observations$/).textContent())!.match(/(\d+) observations/)![1])
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()])
    const csv = readFileSync((await download.path())!, 'utf8').trim().split('\n')
    expect(csv[0]).toMatch(/^observed_at_utc,local_date,local_time/)
    expect(csv).toHaveLength(total + 1)
    await page.screenshot({ path: artifact('observations.png'), fullPage: true })
  })

  it('uploads two photos with a progress bar and plays the series', async () => {
    const files = await Promise.all(['2026:11:18 18:40:00', '2026:11:19 18:40:00'].map(async (when, i) => ({
      name: `moon-${i + 1}.jpg`,
      mimeType: 'image/jpeg',
      buffer: await sharp({ create: { width: 1600, height: 1200, channels: 3, background: { r: 20 + i * 30, g: 20, b: 30 } } })
        .jpeg().withExif({ IFD2: { DateTimeOriginal: when } }).toBuffer(),
    })))
    await openReady(page, `${app.url}/photos`)
    await page.getByLabel('Photos').setInputFiles(files)
    await page.getByRole('button', { name: 'Upload' }).click()
    await page.locator('progress').waitFor()
    await page.getByText('moon-2.jpg: taken 2026-11-19 18:40').waitFor()
    await page.getByRole('button', { name: 'Play series' }).waitFor()
    expect(await page.getByText('1 / 2').count()).toBe(1)
    await page.getByRole('button', { name: 'Next photo' }).click()
    await page.getByText(/2026-11-19 18:40 · Brackenfield/).waitFor()
    await page.screenshot({ path: artifact('photos.png'), fullPage: true })
  })

  it('manages sites', async () => {
    await openReady(page, `${app.url}/sites`)
    await page.getByRole('button', { name: 'Add a site' }).click()
    await page.getByLabel('Name').fill('Orchard gate')
    await page.getByLabel('Latitude (° north +)').fill('-33.9')
    await page.getByLabel('Longitude (° east +)').fill('18.4')
    await page.getByLabel('Latitude (° north +)').focus()
    await page.getByLabel('Time zone').press('Tab')
    await page.getByRole('button', { name: 'Save site' }).click()
    await page.getByRole('heading', { name: 'Orchard gate' }).waitFor()
    expect(await page.getByText('Africa/Johannesburg').count()).toBeGreaterThan(0)
    await page.getByRole('button', { name: /^Night/ }).click()
    // Wait for the buttons' colour transition to reach the night palette before the picture.
    await page.waitForFunction(() => getComputedStyle(document.querySelector('.btn-primary')!).backgroundColor === 'rgb(230, 50, 36)')
    await page.screenshot({ path: artifact('sites-night.png'), fullPage: true })
    await page.getByRole('button', { name: /^Night/ }).click()
  })
})
