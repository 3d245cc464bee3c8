// The sketch desk in Debian's chromium: real pointer input (mouse, pen with pressure, touch), saving,
// reloading, working offline, two tabs at once, night mode. Screenshots go to tests/e2e/artifacts/.

import type { Browser, BrowserContext, CDPSession, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO, startApp, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'
import { insertObservation } from '../support/observations'

let app: RunningApp
let browser: Browser
let observationId: string

const SIZE = 2048
const LANDSCAPE = { width: 1280, height: 800 }

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  // An evening near first quarter at the demo school field (invented site), through an upright finder.
  observationId = insertObservation(app.dataDir, { email: DEMO.observer.email, observedAt: '2026-02-23T19:00:00Z', view: 'upright' })
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

async function signedIn(options: { hasTouch?: boolean } = {}): Promise<BrowserContext> {
  const context = await browser.newContext({ viewport: LANDSCAPE, ...options })
  const page = await context.newPage()
  await openReady(page, `${app.url}/sign-in`)
  await page.getByLabel('E-mail').fill(DEMO.observer.email)
  await page.getByLabel('Password').fill(DEMO.observer.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(url => !url.pathname.startsWith('/sign-in'))
  await page.close()
  return context
}

async function newSketch(context: BrowserContext): Promise<string> {
  const answer = await context.request.post(`${app.url}/api/sketches`, { data: { observationId } })
  expect(answer.status()).toBe(201)
  return (await answer.json()).id
}

async function serverCopy(context: BrowserContext, id: string) {
  const answer = await context.request.get(`${app.url}/api/sketches/${id}`)
  expect(answer.status()).toBe(200)
  return answer.json()
}

async function openDesk(context: BrowserContext, id: string): Promise<Page> {
  const page = await context.newPage()
  page.on('pageerror', error => console.error('page error:', error.message))
  await page.goto(`${app.url}/sketches/${id}`)
  await page.getByTestId('sketch-canvas').waitFor()
  await expect.poll(() => syncState(page)).not.toBe('loading')
  return page
}

const syncState = (page: Page) => page.getByTestId('sketch-sync').getAttribute('data-state')

async function strokeCount(page: Page): Promise<number> {
  const label = await page.getByTestId('sketch-canvas').getAttribute('aria-label')
  return Number(/(\d+) strokes/.exec(label ?? '')?.[1] ?? -1)
}

/** Screen position of a sketch point at the fitted view (zoom 1, no pan). */
async function screen(page: Page, x: number, y: number) {
  const box = (await page.getByTestId('sketch-canvas').boundingBox())!
  const scale = Math.min(box.width, box.height) / SIZE * 0.96
  return { x: box.x + box.width / 2 + (x - SIZE / 2) * scale, y: box.y + box.height / 2 + (y - SIZE / 2) * scale }
}

async function drawWithMouse(page: Page, points: [number, number][]) {
  const first = await screen(page, ...points[0]!)
  await page.mouse.move(first.x, first.y)
  await page.mouse.down()
  for (const [x, y] of points.slice(1)) {
    const at = await screen(page, x, y)
    await page.mouse.move(at.x, at.y, { steps: 3 })
  }
  await page.mouse.up()
}

/** A pen stroke with changing pressure, through the DevTools protocol's pen input. */
async function drawWithPen(page: Page, cdp: CDPSession, points: [number, number, number][]) {
  const send = async (type: string, [x, y, force]: [number, number, number], buttons: number) => {
    const at = await screen(page, x, y)
    await cdp.send('Input.dispatchMouseEvent', { type, x: at.x, y: at.y, button: 'left', buttons, clickCount: 1, pointerType: 'pen', force } as never)
  }
  await send('mousePressed', points[0]!, 1)
  for (const point of points.slice(1)) await send('mouseMoved', point, 1)
  await send('mouseReleased', points.at(-1)!, 0)
}

/** RGBA of one layer's canvas (0 guide, 1 drawing, 2 live stroke) under a sketch point. */
async function pixel(page: Page, layer: number, x: number, y: number): Promise<number[]> {
  const at = await screen(page, x, y)
  return page.evaluate(({ layer, at }) => {
    const canvas = document.querySelectorAll<HTMLCanvasElement>('[data-testid="sketch-canvas"] canvas')[layer]!
    const rect = canvas.getBoundingClientRect()
    const ratio = canvas.width / rect.width
    const data = canvas.getContext('2d')!.getImageData(Math.round((at.x - rect.left) * ratio), Math.round((at.y - rect.top) * ratio), 1, 1).data
    return Array.from(data)
  }, { layer, at })
}

const wave = (y: number, from = 700, to = 1300): [number, number][] =>
  Array.from({ length: 16 }, (_, i) => [from + (to - from) * i / 15, y + 40 * Math.sin(i / 3)] as [number, number])

describe('drawing, saving and reloading', () => {
  let context: BrowserContext
  let id: string
  beforeAll(async () => {
    context = await signedIn()
    id = await newSketch(context)
  })
  afterAll(async () => {
    await context?.close()
  })

  it('draws with mouse and pen, saves, and shows the same strokes after a reload', async () => {
    const page = await openDesk(context, id)
    expect(await syncState(page)).toBe('saved')
    await drawWithMouse(page, wave(800))
    const cdp = await context.newCDPSession(page)
    await drawWithPen(page, cdp, Array.from({ length: 20 }, (_, i) => [750 + 25 * i, 1150 + 10 * Math.cos(i / 2), 0.15 + 0.04 * i] as [number, number, number]))
    expect(await strokeCount(page)).toBe(2)
    // The first pen contact turns palm rejection on.
    await page.getByRole('button', { name: /Pen only: fingers move the view/ }).waitFor()

    // On a slow machine the autosave may take the first stroke before the button is pressed: two versions.
    await page.getByRole('button', { name: 'Save now' }).click()
    await expect.poll(() => syncState(page), { timeout: 20_000 }).toBe('saved')
    const saved = await serverCopy(context, id)
    expect([2, 3]).toContain(saved.version)
    await page.getByText(`Saved · version ${saved.version}`).waitFor()
    const [mouse, pen] = saved.shapes.strokes
    expect(mouse).toMatchObject({ tool: 'pencil', pen: false, tone: 1 })
    expect(pen).toMatchObject({ tool: 'pencil', pen: true })
    const pressures = pen.points.filter((_: number, i: number) => i % 3 === 2)
    expect(Math.max(...pressures) - Math.min(...pressures)).toBeGreaterThan(0.4)
    expect((await pixel(page, 1, ...wave(800)[8]!))[3]).toBeGreaterThan(100)

    await page.reload()
    await page.getByTestId('sketch-canvas').waitFor()
    await expect.poll(() => syncState(page)).toBe('saved')
    expect(await strokeCount(page)).toBe(2)
    await expect.poll(async () => (await pixel(page, 1, ...wave(800)[8]!))[3]).toBeGreaterThan(100)
    await page.screenshot({ path: artifact('sketch-desk-day.png') })
    // A 10-inch tablet held upright: tools above the canvas, details below it.
    await page.setViewportSize({ width: 800, height: 1280 })
    await expect.poll(async () => (await pixel(page, 1, ...wave(800)[8]!))[3]).toBeGreaterThan(100)
    await page.screenshot({ path: artifact('sketch-desk-portrait.png') })
    await page.close()
  })

  it('turns the canvas red on black in night mode, and back', async () => {
    const page = await openDesk(context, id)
    await page.getByRole('button', { name: 'Grid 15°' }).click()
    await page.getByRole('button', { name: /^Night/ }).first().click()
    expect(await page.evaluate(() => document.documentElement.classList.contains('night'))).toBe(true)
    // The guide's lit side (lower right at this evening's first quarter) and a lit stroke are red, not grey.
    await expect.poll(async () => {
      const [r, g, b] = await pixel(page, 0, 1400, 1400)
      return r! > 3 * Math.max(g!, b!, 4)
    }).toBe(true)
    const [r, g, b] = await pixel(page, 1, ...wave(800)[8]!)
    expect(r).toBeGreaterThan(3 * Math.max(g!, b!, 4))
    // The page-wide canvas tint must not dim the canvas a second time.
    expect(await page.evaluate(() => getComputedStyle(document.querySelector('[data-testid="sketch-canvas"] canvas')!).filter)).toBe('none')
    await page.screenshot({ path: artifact('sketch-desk-night.png') })
    await page.getByRole('button', { name: /^Night/ }).first().click()
    await page.close()
  })

  it('undoes and redoes from the keyboard, turns the drawing with the view, zooms with the wheel', async () => {
    const page = await openDesk(context, id)
    await drawWithMouse(page, wave(1300))
    expect(await strokeCount(page)).toBe(3)
    await page.keyboard.press('Control+z')
    expect(await strokeCount(page)).toBe(2)
    await page.keyboard.press('Control+Shift+z')
    expect(await strokeCount(page)).toBe(3)
    await page.keyboard.press('Control+z')
    await page.keyboard.press('Control+y')
    expect(await strokeCount(page)).toBe(3)

    const before = (await serverCopy(context, id)).shapes.strokes[0].points
    await page.getByRole('button', { name: 'North up' }).click()
    await page.keyboard.press('Control+s')
    await expect.poll(() => syncState(page), { timeout: 20_000 }).toBe('saved')
    const after = await serverCopy(context, id)
    expect(after.view.orientation).toBe('north-up')
    const turned = after.shapes.strokes[0].points
    expect(turned[0]).not.toBeCloseTo(before[0], 0)
    // A turn about the disk's centre keeps each point's distance from it.
    expect(Math.hypot(turned[0] - 1024, turned[1] - 1024)).toBeCloseTo(Math.hypot(before[0] - 1024, before[1] - 1024), 0)

    const centre = await screen(page, 1024, 1024)
    await page.mouse.move(centre.x, centre.y)
    await page.mouse.wheel(0, -400)
    await expect.poll(() => page.getByRole('button', { name: 'Fit the sketch in view' }).textContent()).not.toBe('100%')
    await page.close()
  })
})

describe('touch', () => {
  it('pinches to zoom, and in pen-only mode a finger moves the view without drawing', async () => {
    const context = await signedIn({ hasTouch: true })
    const id = await newSketch(context)
    const page = await openDesk(context, id)
    const cdp = await context.newCDPSession(page)
    const touch = (type: string, points: { x: number, y: number }[]) =>
      cdp.send('Input.dispatchTouchEvent', { type, touchPoints: points.map((p, i) => ({ ...p, id: i + 1 })) } as never)

    // One finger draws when pen-only is off.
    const a = await screen(page, 800, 900)
    const b = await screen(page, 1200, 950)
    await touch('touchStart', [a])
    for (let i = 1; i <= 8; i++) await touch('touchMove', [{ x: a.x + (b.x - a.x) * i / 8, y: a.y + (b.y - a.y) * i / 8 }])
    await touch('touchEnd', [])
    expect(await strokeCount(page)).toBe(1)

    // Two fingers spreading apart zoom in.
    const c = await screen(page, 1024, 1024)
    await touch('touchStart', [{ x: c.x - 40, y: c.y }, { x: c.x + 40, y: c.y }])
    for (let i = 1; i <= 6; i++) await touch('touchMove', [{ x: c.x - 40 - 15 * i, y: c.y }, { x: c.x + 40 + 15 * i, y: c.y }])
    await touch('touchEnd', [])
    const zoom = Number((await page.getByRole('button', { name: 'Fit the sketch in view' }).textContent())!.replace('%', ''))
    expect(zoom).toBeGreaterThan(150)
    expect(await strokeCount(page)).toBe(1)

    await page.getByRole('button', { name: 'Pen only: off' }).click()
    await touch('touchStart', [c])
    for (let i = 1; i <= 6; i++) await touch('touchMove', [{ x: c.x + 20 * i, y: c.y + 10 * i }])
    await touch('touchEnd', [])
    expect(await strokeCount(page)).toBe(1)
    await context.close()
  })
})

describe('the offline worker', () => {
  it('opens the desk, reloads it and opens it again directly, with a worker and cache named after this build', async () => {
    const context = await signedIn()
    const id = await newSketch(context)
    const errors: string[] = []
    let page = await openDesk(context, id)
    page.on('console', m => m.type() === 'error' && errors.push(m.text()))
    await expect.poll(() => page.evaluate(() => Boolean(navigator.serviceWorker.controller)), { timeout: 20_000 }).toBe(true)
    // The build's id, as Nuxt publishes it for its own update checks.
    const buildId = (await (await context.request.get(`${app.url}/_nuxt/builds/latest.json`)).json()).id as string
    expect(buildId).toMatch(/\w/)
    expect(await page.evaluate(() => navigator.serviceWorker.controller!.scriptURL)).toContain(`build=${buildId}`)
    await expect.poll(() => page.evaluate(() => caches.keys()), { timeout: 20_000 }).toEqual([`shadowline-sketch-pages-${buildId}`])

    await page.reload()
    await page.getByTestId('sketch-canvas').waitFor()
    await expect.poll(() => syncState(page)).toBe('saved')
    await page.close()
    page = await openDesk(context, id)
    page.on('console', m => m.type() === 'error' && errors.push(m.text()))
    await page.reload()
    await page.getByTestId('sketch-canvas').waitFor()
    expect(errors.filter(e => /MIME|Failed to fetch dynamically imported module/i.test(e))).toEqual([])
    await context.close()
  })
})

describe('naming a place by touch', () => {
  it('after the pen has been used, a finger tap with "Name a place" still pins', async () => {
    const context = await signedIn({ hasTouch: true })
    const id = await newSketch(context)
    const page = await openDesk(context, id)
    const cdp = await context.newCDPSession(page)
    await drawWithPen(page, cdp, Array.from({ length: 10 }, (_, i) => [800 + 30 * i, 1200, 0.5] as [number, number, number]))
    await page.getByRole('button', { name: /Pen only: fingers move the view/ }).waitFor()
    await page.getByRole('button', { name: 'Name a place', exact: true }).click()
    const at = await screen(page, 1100, 900)
    const touch = (type: string, points: { x: number, y: number }[]) =>
      cdp.send('Input.dispatchTouchEvent', { type, touchPoints: points.map((p, i) => ({ ...p, id: i + 1 })) } as never)
    await touch('touchStart', [at])
    await touch('touchEnd', [])
    await page.getByRole('dialog').waitFor({ timeout: 5_000 })
    expect(await strokeCount(page)).toBe(1)
    await context.close()
  })
})

describe('never losing a stroke', () => {
  it('keeps strokes drawn offline, still has them after an offline reload, and saves them once back online', async () => {
    const context = await signedIn()
    const id = await newSketch(context)
    // Every save that the server took, with what it carried: each stroke must arrive in exactly one.
    const landed: { method: string, added: string[], bytes: number }[] = []
    context.on('response', (response) => {
      const request = response.request()
      if (!request.url().endsWith(`/api/sketches/${id}`) || !['PATCH', 'PUT'].includes(request.method()) || response.status() !== 200) return
      const body = request.postDataJSON()
      const added = request.method() === 'PATCH'
        ? body.steps.filter((s: any) => s.op === 'add').map((s: any) => s.stroke.id)
        : body.shapes.strokes.map((s: any) => s.id)
      landed.push({ method: request.method(), added, bytes: request.postDataBuffer()?.length ?? 0 })
    })
    const unvisitedId = await newSketch(context)
    let page = await openDesk(context, id)
    await drawWithMouse(page, wave(900))
    await page.getByRole('button', { name: 'Save now' }).click()
    await expect.poll(() => syncState(page), { timeout: 20_000 }).toBe('saved')
    // The page's service worker has kept the page and its assets for an offline visit.
    await expect.poll(() => page.evaluate(async () => Boolean(navigator.serviceWorker.controller && await caches.match(location.pathname))), { timeout: 20_000 }).toBe(true)

    await context.setOffline(true)
    await drawWithMouse(page, wave(1100))
    await drawWithMouse(page, wave(1250))
    expect(await strokeCount(page)).toBe(3)
    await expect.poll(() => syncState(page), { timeout: 10_000 }).toBe('offline')
    await page.getByText('Offline · kept on this device').waitFor()
    await page.screenshot({ path: artifact('sketch-desk-offline.png') })

    // Reloaded with no network: the page comes from the worker's cache, the strokes from IndexedDB. (A sketch
    // page never visited has nothing cached and cannot open: the network really is gone.)
    const unvisited = await context.newPage()
    expect(await unvisited.goto(`${app.url}/sketches/${unvisitedId}`).then(() => 'opened', () => 'failed')).toBe('failed')
    await unvisited.close()
    await page.reload()
    await page.getByTestId('sketch-canvas').waitFor()
    expect(await strokeCount(page)).toBe(3)
    expect(await syncState(page)).toBe('offline')
    expect((await serverCopy(context, id)).shapes.strokes).toHaveLength(1)

    // Back online, the autosave sends them: the two new strokes only, as operations on version 2.
    await context.setOffline(false)
    await expect.poll(() => syncState(page), { timeout: 20_000 }).toBe('saved')
    let saved = await serverCopy(context, id)
    expect(saved.version).toBe(3)
    expect(saved.shapes.strokes).toHaveLength(3)
    expect(landed.map(l => [l.method, l.added.length])).toEqual([['PATCH', 1], ['PATCH', 2]])

    // A tab that goes away (a crash, a flat battery) before it could save loses nothing either.
    await drawWithMouse(page, wave(1350))
    await context.setOffline(true)
    await expect.poll(() => syncState(page), { timeout: 10_000 }).toBe('offline')
    await page.close()
    await context.setOffline(false)
    page = await openDesk(context, id)
    expect(await strokeCount(page)).toBe(4)
    await expect.poll(() => syncState(page), { timeout: 20_000 }).toBe('saved')
    saved = await serverCopy(context, id)
    expect(saved.shapes.strokes).toHaveLength(4)
    // Every stroke reached the server once: one landed save carried each, and the drawing holds each once.
    const serverIds = saved.shapes.strokes.map((s: any) => s.id)
    expect(new Set(serverIds).size).toBe(4)
    expect(landed.flatMap(l => l.added).sort()).toEqual([...serverIds].sort())
    expect(landed.every(l => l.method === 'PATCH')).toBe(true)
    await context.close()
  })

  it('offers a choice when two tabs save the same sketch, and loses neither copy', async () => {
    const context = await signedIn()
    const id = await newSketch(context)
    const first = await openDesk(context, id)
    const second = await openDesk(context, id)

    // The observer switches between the tabs; a tab in the background gets no animation frames.
    await first.bringToFront()
    await drawWithMouse(first, wave(850))
    await first.getByRole('button', { name: 'Save now' }).click()
    await expect.poll(() => syncState(first), { timeout: 20_000 }).toBe('saved')

    // The second tab's autosave, a few seconds after its last stroke, finds the first tab's version.
    await second.bringToFront()
    await drawWithMouse(second, wave(1200))
    await drawWithMouse(second, wave(1300))
    const dialog = second.getByRole('alertdialog')
    await dialog.waitFor({ timeout: 20_000 })
    expect(await syncState(second)).toBe('conflict')
    await second.screenshot({ path: artifact('sketch-desk-conflict.png') })
    await dialog.getByRole('button', { name: 'Keep mine as a new version' }).click()
    await expect.poll(() => syncState(second), { timeout: 20_000 }).toBe('saved')
    expect((await serverCopy(context, id)).shapes.strokes).toHaveLength(2)
    // The copy kept after the conflict went whole, so it is a checkpoint; version 2 is stored as its operations.
    const revisions = await (await context.request.get(`${app.url}/api/sketches/${id}/revisions`)).json()
    expect(revisions.checkpoints.map((r: any) => [r.version, r.reason])).toEqual([[3, 'full'], [1, 'created']])

    // The first tab now lags behind: it takes the saved version instead.
    await first.bringToFront()
    await drawWithMouse(first, wave(1000))
    await first.getByRole('alertdialog').getByRole('button', { name: 'Load version 3' }).click({ timeout: 20_000 })
    await expect.poll(() => syncState(first)).toBe('saved')
    expect(await strokeCount(first)).toBe(2)
    await context.close()
  })
})

describe('history', () => {
  it('lists the versions kept whole with their images, and brings one back as the newest version', async () => {
    const context = await signedIn()
    const id = await newSketch(context)
    const desk = await openDesk(context, id)
    await drawWithMouse(desk, wave(800))
    await desk.getByRole('button', { name: 'Save now' }).click()
    await expect.poll(() => syncState(desk), { timeout: 20_000 }).toBe('saved')
    // A whole save, as "keep mine" after a conflict makes: version 3 is kept whole, with two strokes.
    const copy = await serverCopy(context, id)
    const strokes = [...copy.shapes.strokes, { id: 'kept1', tool: 'shade', tone: 0.3, size: 160, points: wave(1200).flatMap(([x, y]) => [x, y, 0.5]) }]
    const whole = await context.request.put(`${app.url}/api/sketches/${id}`, { data: { baseVersion: 2, saveId: crypto.randomUUID(), ...copy.view, shapes: { ...copy.shapes, strokes } } })
    expect(whole.status()).toBe(200)
    await desk.close()

    const page = await context.newPage()
    await openReady(page, `${app.url}/sketches/${id}/revisions`)
    const items = page.getByTestId('sketch-revisions').getByRole('listitem')
    await expect.poll(() => items.count()).toBe(2)
    await expect.poll(() => items.first().textContent()).toMatch(/Version 3 · current.*Saved whole.*2 strokes/s)
    // Every image has loaded, drawn by the server from that version.
    await expect.poll(() => page.evaluate(() => [...document.querySelectorAll<HTMLImageElement>('[data-testid="sketch-revisions"] img')].every(i => i.complete && i.naturalWidth === 256))).toBe(true)
    await page.screenshot({ path: artifact('sketch-revisions.png'), fullPage: true })

    await items.nth(1).getByRole('button', { name: 'Bring back' }).click()
    await page.getByText('Brought back as version 4.').waitFor()
    await expect.poll(() => items.first().textContent()).toMatch(/Version 4 · current.*Brought back.*0 strokes/s)
    expect((await serverCopy(context, id)).shapes.strokes).toEqual([])

    await page.setViewportSize({ width: 390, height: 844 })
    await page.getByRole('button', { name: /^Night/ }).first().click()
    await page.screenshot({ path: artifact('sketch-revisions-phone-night.png'), fullPage: true })
    await context.close()
  })
})
