// The image the server draws from stored strokes against the browser's painting of the same strokes. Both
// run the editor's painter (shared/sketch/paint.ts): the server through @napi-rs/canvas, the browser through
// chromium's own Canvas 2D. Both are Skia underneath, but they are different builds and the served image is a
// lossy WebP (quality 90), so they are compared within a tolerance rather than byte for byte:
//   - mean absolute difference at most 2 levels of 255, and
//   - at most 0.5 % of pixels differing by more than 32 levels (a visible difference, edge antialiasing aside).
// The tolerance is this project's choice for "looks the same"; the last check shows it does notice a
// drawing that differs by one filled area.

import sharp from 'sharp'
import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SKETCH_SIZE } from '../../shared/sketch/frame'
import { emptyShapes } from '../../shared/sketch/schema'
import type { Stroke } from '../../shared/sketch/schema'
import { Client, DEMO, startApp, type RunningApp } from '../support/app'
import { launchBrowser } from '../support/browser'
import { insertObservation } from '../support/observations'
import { painterBundle } from '../support/painter'

let app: RunningApp
let browser: Browser
let observer: Client

/** A wavy centre line from (x, y) rightwards, with pressure rising and falling along it. */
function line(x: number, y: number, length: number, amplitude: number): number[] {
  return Array.from({ length: 40 }, (_, i) => [x + length * i / 39, y + amplitude * Math.sin(i / 5), 0.3 + 0.5 * Math.sin(Math.PI * i / 39)]).flat()
    .map(v => Math.round(v * 100) / 100)
}

const STROKES: Stroke[] = [
  { id: 'fill', tool: 'fill', tone: 0.5, points: [700, 700, 0.5, 1300, 720, 0.5, 1280, 1300, 0.5, 720, 1280, 0.5] },
  { id: 'pen', tool: 'pencil', tone: 1, size: 12, pen: true, points: line(500, 600, 1000, 60) },
  { id: 'finger', tool: 'pencil', tone: 0.75, size: 20, pen: false, points: line(500, 1500, 1000, -80) },
  { id: 'shade', tool: 'shade', tone: 0.25, size: 140, points: line(600, 1000, 800, 120) },
  { id: 'cut', tool: 'eraser', size: 60, pen: false, points: line(300, 600, 400, 30) },
]

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  observer = new Client(app.url)
  await observer.signIn(DEMO.observer.email, DEMO.observer.password)
})
afterAll(async () => {
  await browser?.close()
  await app?.stop()
})

/** Grey levels of an RGB(A) image, one byte a pixel. */
function grey(data: Uint8Array, channels: number): Uint8Array {
  const out = new Uint8Array(data.length / channels)
  for (let i = 0; i < out.length; i++) out[i] = Math.round((data[i * channels]! + data[i * channels + 1]! + data[i * channels + 2]!) / 3)
  return out
}

function compare(a: Uint8Array, b: Uint8Array) {
  let sum = 0
  let visible = 0
  for (let i = 0; i < a.length; i++) {
    const d = Math.abs(a[i]! - b[i]!)
    sum += d
    if (d > 32) visible++
  }
  return { meanDifference: sum / a.length, visibleShare: visible / a.length }
}

describe('one painter on both sides', () => {
  it('draws on the server what the browser paints for the same strokes, within the stated tolerance', async () => {
    const observationId = insertObservation(app.dataDir, { email: DEMO.observer.email, observedAt: '2026-02-23T19:00:00Z' })
    const created = await observer.post('/api/sketches', { observationId })
    const id = created.body.id as string
    const saved = await observer.request('PUT', `/api/sketches/${id}`, {
      baseVersion: 1, saveId: crypto.randomUUID(), orientation: 'zenith-up', flip: 'none', shapes: { ...emptyShapes(), strokes: STROKES },
    })
    expect(saved.status).toBe(200)

    const served = await fetch(`${app.url}/api/sketches/${id}/raster`, { headers: { cookie: observer.cookieHeader() } })
    expect(served.status).toBe(200)
    const decoded = await sharp(Buffer.from(await served.arrayBuffer())).raw().toBuffer({ resolveWithObject: true })
    expect([decoded.info.width, decoded.info.height]).toEqual([SKETCH_SIZE, SKETCH_SIZE])
    const server = grey(decoded.data, decoded.info.channels)

    const page = await browser.newPage()
    await page.setContent('<!doctype html><title>painter</title>')
    await page.addScriptTag({ content: await painterBundle() })
    const paint = async (strokes: Stroke[]) => grey(
      new Uint8Array(Buffer.from(await page.evaluate(([s, edge]) => window.sketchPainter.rasterPixels(s, edge), [strokes, SKETCH_SIZE] as const), 'base64')),
      4,
    )
    const browserPixels = await paint(STROKES)
    await page.close()

    // The drawing is really there: the fill's middle is mid grey in both, the paper black.
    const at = (pixels: Uint8Array, x: number, y: number) => pixels[y * SKETCH_SIZE + x]!
    expect(at(browserPixels, 1000, 740)).toBeGreaterThan(100)
    expect(at(server, 1000, 740)).toBeGreaterThan(100)
    expect(at(server, 100, 100)).toBeLessThan(8)

    const same = compare(server, browserPixels)
    console.log('server image against the browser painting:', same)
    expect(same.meanDifference).toBeLessThanOrEqual(2)
    expect(same.visibleShare).toBeLessThanOrEqual(0.005)

    // The tolerance does notice a real difference: the browser's painting without the filled area.
    const page2 = await browser.newPage()
    await page2.setContent('<!doctype html><title>painter</title>')
    await page2.addScriptTag({ content: await painterBundle() })
    const without = grey(new Uint8Array(Buffer.from(await page2.evaluate(([s, edge]) => window.sketchPainter.rasterPixels(s, edge), [STROKES.slice(1), SKETCH_SIZE] as const), 'base64')), 4)
    await page2.close()
    const different = compare(server, without)
    expect(different.visibleShare).toBeGreaterThan(0.005)
  }, 180_000)
})
