// What a page downloads: the public pages (what a learner opens first, often on a phone) load no canvas or
// chart library, the built assets go out compressed and cacheable, and the atlas images come at the size they
// are shown without shifting the page. The figures (bytes, paint times) are in `npm run bench:weight`; this
// checks only what must hold, so a global registration or a stray import cannot creep back unseen.

import { request as httpRequest } from 'node:http'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO, startApp, type RunningApp } from '../support/app'
import { launchBrowser } from '../support/browser'

// A string each library's code carries, that minification keeps: Konva's console prefix (konva/lib/Util.js,
// KONVA_WARNING) and Chart.js's message when a canvas is reused (chart.js/dist/chart.js). The sketch desk
// check below shows the Konva mark is found where Konva really is.
const KONVA = 'Konva warning: '
const CHART_JS = 'Canvas is already in use'

let app: RunningApp
let browser: Browser
let entryId: string

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  const atlas = await (await fetch(`${app.url}/api/atlas`)).json() as { items: { id: string }[] }
  entryId = atlas.items[0]!.id
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

/** Opens a page as a first visit and answers the text of every script module it requested. */
async function scriptsOf(page: Page, url: string): Promise<Map<string, string>> {
  const pending: Promise<void>[] = []
  const scripts = new Map<string, string>()
  page.on('response', (response) => {
    const path = new URL(response.url()).pathname
    if (response.request().resourceType() === 'script' || path.endsWith('.js')) {
      pending.push(response.text().then((text) => {
        scripts.set(path, text)
      }, () => undefined))
    }
  })
  await page.goto(url)
  await page.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
  await page.waitForLoadState('networkidle')
  await Promise.all(pending)
  return scripts
}

const carrying = (scripts: Map<string, string>, mark: string) => [...scripts].filter(([, text]) => text.includes(mark)).map(([path]) => path)

/** Raw response headers for a request with the given Accept-Encoding (fetch would decode and hide them). */
function head(url: string, acceptEncoding: string): Promise<{ status: number, headers: Record<string, string | string[] | undefined>, length: number }> {
  return new Promise((done, fail) => {
    const req = httpRequest(url, { headers: { 'accept-encoding': acceptEncoding } }, (res) => {
      let length = 0
      res.on('data', (chunk: Buffer) => {
        length += chunk.length
      })
      res.on('end', () => done({ status: res.statusCode ?? 0, headers: res.headers, length }))
    })
    req.on('error', fail)
    req.end()
  })
}

describe('each page loads what it uses', () => {
  it('loads no Konva and no Chart.js module on the public pages', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true })
    for (const path of ['/', '/atlas', `/atlas/${entryId}`, '/learn', '/features']) {
      const page = await context.newPage()
      const scripts = await scriptsOf(page, app.url + path)
      expect(scripts.size, `${path} loaded its scripts`).toBeGreaterThan(0)
      expect(carrying(scripts, KONVA), `Konva on ${path}`).toEqual([])
      expect(carrying(scripts, CHART_JS), `Chart.js on ${path}`).toEqual([])
      await page.close()
    }
    await context.close()
  })

  it('loads Konva on the sketch desk, where the canvas is drawn', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    expect((await context.request.post(`${app.url}/api/auth/sign-in`, { data: DEMO.observer })).status()).toBe(200)
    const sketches = await (await context.request.get(`${app.url}/api/sketches`)).json() as { items: { id: string }[] }
    const page = await context.newPage()
    const scripts = await scriptsOf(page, `${app.url}/sketches/${sketches.items[0]!.id}`)
    await page.getByTestId('sketch-canvas').locator('canvas').first().waitFor()
    expect(carrying(scripts, KONVA).length).toBeGreaterThan(0)
    await context.close()
  })
})

describe('the display font', () => {
  it('is preloaded where a heading is on the first screen, and not on the sketch desk', async () => {
    const preload = /<link rel="preload" as="font" type="font\/woff2" href="(\/_nuxt\/crimson-pro-400-core\.[\w-]+\.woff2)"/
    const home = await (await fetch(`${app.url}/`)).text()
    const href = preload.exec(home)?.[1]
    expect(href).toBeTruthy()
    // The stylesheet's @font-face names the same file, so the browser fetches it once.
    const css = await (await fetch(app.url + /<link rel="stylesheet" href="([^"]+)"/.exec(home)![1]!)).text()
    expect(css.includes(`url(./${href!.split('/').pop()})`)).toBe(true)
    expect(await (await fetch(`${app.url}/atlas/${entryId}`)).text()).toMatch(preload)

    const context = await browser.newContext()
    expect((await context.request.post(`${app.url}/api/auth/sign-in`, { data: DEMO.observer })).status()).toBe(200)
    const sketches = await (await context.request.get(`${app.url}/api/sketches`)).json() as { items: { id: string }[] }
    const desk = await context.request.get(`${app.url}/sketches/${sketches.items[0]!.id}`, { maxRedirects: 0 })
    expect(desk.status()).toBe(200) // the desk itself, not a redirect to sign in
    expect(await desk.text()).not.toMatch(/rel="preload" as="font"/)
    await context.close()
  })
})

describe('compressed, cacheable assets', () => {
  it('serves the built JavaScript as brotli or gzip as the browser accepts, cached as immutable', async () => {
    const html = await (await fetch(`${app.url}/`)).text()
    const script = /<script[^>]+src="(\/_nuxt\/[^"]+\.js)"/.exec(html)?.[1]
    expect(script).toBeTruthy()
    const plain = await head(app.url + script, 'identity')
    const br = await head(app.url + script, 'gzip, deflate, br')
    const gzip = await head(app.url + script, 'gzip')
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(br.headers['content-encoding']).toBe('br')
    expect(gzip.headers['content-encoding']).toBe('gzip')
    expect(br.length).toBeLessThan(plain.length / 2)
    expect(gzip.length).toBeLessThan(plain.length / 2)
    // Caches must keep the encodings apart (RFC 9110 §12.5.5); hashed names never change (RFC 8246).
    expect(String(br.headers.vary)).toMatch(/accept-encoding/i)
    for (const answer of [plain, br, gzip]) expect(String(answer.headers['cache-control'])).toMatch(/immutable/)
  })
})

describe('images for the phone', () => {
  it('gives atlas cards both thumbnails to choose from, a size that reserves their box, and lazy loading', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 3, isMobile: true })
    const page = await context.newPage()
    await page.goto(`${app.url}/atlas`)
    const cards = await page.locator('article img').evaluateAll(images => images.map(img => ({
      srcset: img.getAttribute('srcset') ?? '',
      sizes: img.getAttribute('sizes') ?? '',
      width: img.getAttribute('width'),
      height: img.getAttribute('height'),
      loading: img.getAttribute('loading'),
    })))
    expect(cards.length).toBeGreaterThan(0)
    for (const card of cards) {
      expect(card.srcset).toMatch(/size=small 256w/)
      expect(card.srcset).toMatch(/size=large 512w/)
      expect(card.sizes).not.toBe('')
      expect([card.width, card.height]).toEqual(['256', '256'])
    }
    // On a phone the filters fill the first screen: every card is below it.
    expect(cards.every(card => card.loading === 'lazy')).toBe(true)
    // At 3 device pixels per CSS pixel a half-width card (about 173 CSS px) needs the 512 px thumbnail.
    const first = page.locator('article img').first()
    await first.scrollIntoViewIfNeeded()
    await page.waitForFunction(() => {
      const img = document.querySelector<HTMLImageElement>('article img')
      return Boolean(img?.complete && img.currentSrc)
    })
    expect(await first.evaluate(img => (img as HTMLImageElement).currentSrc)).toMatch(/size=large/)
    await context.close()
  })
})
