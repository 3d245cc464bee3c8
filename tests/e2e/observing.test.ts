import { execFileSync } from 'node:child_process'
import { readFileSync, readdirSync, rmSync } from 'node:fs'
import sharp from 'sharp'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO, startApp, type RunningApp } from '../support/app'
import { ARTIFACTS, artifact, launchBrowser, openReady } from '../support/browser'

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
  it('plans tonight with the cautions, the night plot and the observing windows', async () => {
    await openReady(page, `${app.url}/tonight?date=2026-11-16`)
    await page.getByRole('heading', { name: 'Through the night' }).waitFor()
    await page.locator('canvas').first().waitFor()
    expect(await page.getByLabel('Observing safely').count()).toBeGreaterThan(0)
    expect(await page.getByText('start the series here').count()).toBe(1)
    await page.screenshot({ path: artifact('tonight.png'), fullPage: true })
  })

  it('plans a waning evening in the south: only coming windows, the next moonrise, the disk drawn when the Moon is up', async () => {
    // An invented site near 34° S, 18° E. On 2026-12-02 the Moon is waning, eight days past full (astronomy-engine).
    const made = await page.request.post(`${app.url}/api/sites`, { data: { name: 'Southern test hill', latitude: -33.93, longitude: 18.47, elevation: 40 } })
    expect(made.status()).toBe(201)
    const site = await made.json()
    await openReady(page, `${app.url}/tonight?siteId=${site.id}&date=2026-12-02`)
    await page.getByRole('heading', { name: /Observing windows/ }).waitFor()
    const windows = await page.locator('[data-window]').evaluateAll(items => items.map(i => i.getAttribute('data-window')!))
    expect(windows).toHaveLength(14)
    // The night of the 2nd: its own morning (before dawn on the 3rd) first, and nothing already past.
    expect(windows.every(w => w.slice(0, 10) >= '2026-12-03' || w.startsWith('2026-12-02 evening'))).toBe(true)
    expect(windows[0]).toMatch(/^2026-12-03 morning/)
    // The next moonrise, late that evening or after midnight; never the morning's, already past.
    const moonrise = await page.getByTestId('moonrise').textContent()
    expect(moonrise).not.toMatch(/this morning/)
    expect(await page.getByText('Next moonrise').count()).toBe(1)
    expect(await page.getByTestId('drawn-for').textContent()).toMatch(/when it is up: at nightfall it is still below the horizon/)
    // No evening-crescent caution on a waning night.
    expect(await page.getByLabel('Observing safely').getAttribute('data-cautions')).not.toMatch(/evening-crescent/)
    await page.screenshot({ path: artifact('tonight-south-waning.png'), fullPage: true })
    await page.getByRole('link', { name: 'Next lunation' }).click()
    await page.waitForURL(/date=2027-01-01/)
    await page.getByRole('link', { name: 'Previous lunation' }).waitFor()
    await page.request.delete(`${app.url}/api/sites/${site.id}`)
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

  it('prints a worksheet to hand out on A4 and on US Letter: name, site, lunation, filled and blank rows, charts inside their boxes', async () => {
    await openReady(page, `${app.url}/worksheet?date=2026-11-18`)
    await page.getByRole('heading', { name: 'Azimuth night by night' }).waitFor()
    await page.emulateMedia({ media: 'print' })
    const sheet = page.getByTestId('print-sheet')
    await sheet.waitFor()
    const text = await sheet.textContent()
    expect(text).toMatch(/Observer/)
    expect(text).toMatch(/Site/)
    expect(text).toMatch(/new moon .* to new moon/)
    expect(await sheet.locator('tr.logged').count()).toBeGreaterThan(0)
    expect(await sheet.locator('tr.to-come').count()).toBeGreaterThan(0)
    // Each chart stays inside its figure, and its measured points are dark ink on white.
    for (const figure of await sheet.locator('.sheet-charts figure').all()) {
      const box = (await figure.boundingBox())!
      const svg = (await figure.locator('svg').boundingBox())!
      expect(svg.x).toBeGreaterThanOrEqual(box.x - 0.5)
      expect(svg.x + svg.width).toBeLessThanOrEqual(box.x + box.width + 0.5)
    }
    const fill = await sheet.locator('.sheet-charts circle.measured').first().evaluate(c => getComputedStyle(c).fill)
    expect(fill).toBe('rgb(0, 0, 0)')
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = artifact(`worksheet-${format}.pdf`)
      await page.pdf({ path: pdf, format, printBackground: true })
      // Render each page to PNG to look at (poppler's pdftoppm); the sheet fits on one or two pages.
      const prefix = artifact(`worksheet-${format}`)
      for (const old of readdirSync(ARTIFACTS).filter(f => f.startsWith(`worksheet-${format}-`))) rmSync(artifact(old))
      execFileSync('pdftoppm', ['-png', '-r', '60', pdf, prefix])
      const pages = readdirSync(ARTIFACTS).filter(f => f.startsWith(`worksheet-${format}-`) && f.endsWith('.png'))
      expect(pages.length).toBeGreaterThanOrEqual(1)
      expect(pages.length).toBeLessThanOrEqual(2)
    }
    await page.emulateMedia({ media: 'screen' })
  })

  it('says what is wrong in the form\'s words, warns of a Moon below the horizon until confirmed, and deletes with feedback', async () => {
    await openReady(page, `${app.url}/observations/new`)
    // 2026-11-18 09:00 at the demo site (invented, mid-north): the young crescent is below the horizon.
    await page.getByLabel('Date at the site').fill('2026-11-18')
    await page.getByLabel(/^Time at the site/).fill('09:00')
    await page.getByTestId('plausibility').waitFor()
    expect(await page.getByTestId('plausibility').textContent()).toMatch(/below the horizon at this site/)
    await page.getByRole('button', { name: 'Save observation' }).click()
    await page.getByText('Confirm the date and time above, or correct them, to save.').waitFor()
    expect(page.url()).toMatch(/\/observations\/new$/)
    await page.getByLabel('The date and time are right; save it as it is.').check()
    // A clinometer reading out of range: the message uses the form's label, never the field's name.
    await page.getByLabel('Clinometer reading (°)').fill('500')
    await page.getByRole('button', { name: 'Save observation' }).click()
    const notice = page.getByRole('alert').filter({ hasText: /Clinometer reading/ })
    await notice.first().waitFor()
    expect(await page.locator('main').textContent()).not.toMatch(/clinometerReadingDeg/)
    await page.getByLabel('Clinometer reading (°)').fill('')
    await page.getByRole('button', { name: 'Save observation' }).click()
    await page.waitForURL(/\/observations\/[0-9a-f-]{36}$/)
    page.once('dialog', dialog => dialog.accept())
    await page.getByRole('button', { name: 'Delete' }).click()
    await page.waitForURL(/\/observations\?deleted=/)
    await page.getByText('The observation of 2026-11-18 09:00 was deleted, with its measurements.').waitFor()
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
    // Before anything is uploaded, the page says that a photo far from any observation starts one.
    expect(await page.getByTestId('photo-creates-observation').textContent()).toMatch(/starts a new observation/)
    await page.getByRole('button', { name: 'Upload' }).click()
    await page.locator('progress').waitFor()
    await page.getByText('moon-2.jpg: taken 2026-11-19 18:40').waitFor()
    await page.getByRole('button', { name: 'Play series' }).waitFor()
    expect(await page.getByText('1 / 2').count()).toBe(1)
    await page.getByRole('button', { name: 'Next photo' }).click()
    await page.getByText(/2026-11-19 18:40 · Brackenfield/).waitFor()
    await page.screenshot({ path: artifact('photos.png'), fullPage: true })
  })

  it('keeps night mode on the 404 and "not for this account" pages, and on sliders and progress bars', async () => {
    const night = await browser.newPage({ viewport: { width: 1280, height: 800 } })
    await night.context().addCookies(await page.context().cookies())
    await night.addInitScript(() => localStorage.setItem('shadowline.display', JSON.stringify({ night: true, brightness: 1 })))
    const isNight = () => night.evaluate(() => ({
      night: document.documentElement.classList.contains('night'),
      background: getComputedStyle(document.body).backgroundColor,
    }))
    await night.goto(`${app.url}/no-such-page`)
    await night.getByRole('heading', { name: 'Nothing here' }).waitFor()
    expect(await isNight()).toEqual({ night: true, background: 'rgb(0, 0, 0)' })
    await night.goto(`${app.url}/admin/users`)
    await night.getByRole('heading', { name: 'Not for this account' }).waitFor()
    expect(await isNight()).toEqual({ night: true, background: 'rgb(0, 0, 0)' })
    // Sliders and progress bars take the red accent, not the browser's blue or grey.
    await openReady(night, `${app.url}/photos`)
    const accent = await night.evaluate(() => {
      const probe = (html: string) => {
        const holder = document.createElement('div')
        holder.innerHTML = html
        document.body.append(holder)
        const colour = getComputedStyle(holder.firstElementChild!).accentColor
        holder.remove()
        return colour
      }
      return { range: probe('<input type="range">'), progress: probe('<progress value="0.5"></progress>') }
    })
    expect(accent).toEqual({ range: 'rgb(230, 50, 36)', progress: 'rgb(230, 50, 36)' })
    await night.screenshot({ path: artifact('night-photos.png'), fullPage: true })
    await night.close()
  })

  it('fits the whole navigation at 1280 px for an administrator, and shows on a phone that it scrolls', async () => {
    const admin = await browser.newPage({ viewport: { width: 1280, height: 800 } })
    await openReady(admin, `${app.url}/sign-in`)
    await admin.getByLabel('E-mail').fill(DEMO.admin.email)
    await admin.getByLabel('Password').fill(DEMO.admin.password)
    await admin.getByRole('button', { name: 'Sign in' }).click()
    await admin.getByText('Welcome back').waitFor()
    const nav = admin.getByTestId('main-nav')
    expect(await nav.getByRole('link', { name: 'Caught mail' }).count()).toBe(1)
    const fits = () => nav.evaluate((el) => {
      const links = [...el.querySelectorAll('a')].map(a => a.getBoundingClientRect())
      return { overflow: el.scrollWidth - el.clientWidth, allInView: links.every(r => r.left >= 0 && r.right <= window.innerWidth) }
    })
    expect(await fits()).toEqual({ overflow: 0, allInView: true })
    await admin.screenshot({ path: artifact('nav-admin-1280.png') })
    await admin.setViewportSize({ width: 390, height: 844 })
    const phone = await nav.evaluate(el => ({ scrolls: el.scrollWidth > el.clientWidth, mask: getComputedStyle(el).maskImage }))
    expect(phone.scrolls).toBe(true)
    expect(phone.mask).toMatch(/gradient/)
    // The page itself never scrolls sideways, night mode's brightness slider included.
    await admin.getByRole('button', { name: /^Night/ }).first().click()
    await admin.getByLabel('Screen brightness').waitFor()
    expect(await admin.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await admin.screenshot({ path: artifact('nav-admin-phone-night.png') })
    await admin.screenshot({ path: artifact('nav-admin-phone.png') })
    await admin.close()
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
