// Benchmark of the sketch desk. A script, not a test: timings vary with the machine and never gate anything.
//   npm run bench:sketch   (after `npm run build`) → prints the figures and writes bench/results/sketch.json
//
// 1. Render: the built app opens a sketch of 2,000 strokes (about 200,000 points) in headless chromium. The
//    editor marks when the sketch is opened (strokes in the store) and when its drawing layer has painted
//    every stroke (User Timing marks 'sketch:opened' and 'sketch:painted'). In the same page the same strokes
//    are then painted on a bare canvas 2D context, at the same size and transform, by the same painter
//    (shared/sketch/paint.ts: perfect-freehand outlines, Path2D fills), without Konva or Vue.
// 2. Save: PUT /api/sketches/[id] with the editor's 2048² PNG raster (made in the page by the editor's raster
//    code), against the bare work the route cannot avoid: sharp decoding the PNG, encoding the WebP image and
//    its 512 and 256 px thumbnails, and the three S3 puts (to an embedded S3 in this process).

import { randomUUID } from 'node:crypto'
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { cpus, platform, release, tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import sharp from 'sharp'
import { build } from 'vite'
import { startEmbeddedS3 } from '../server/utils/embedded'
import { createObjectStore } from '../server/utils/storage'
import { emptyShapes } from '../shared/sketch/schema'
import type { Stroke } from '../shared/sketch/schema'
import { DEMO, startApp } from '../tests/support/app'
import { launchBrowser } from '../tests/support/browser'
import { insertObservation } from '../tests/support/observations'

const ROOT = resolve(import.meta.dirname, '..')
const STROKES = 2000
const RENDER_RUNS = 5
const SAVE_RUNS = 9

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}
const round = (value: number) => Math.round(value * 100) / 100

/** Seeded so every run draws the same sketch. */
function random(seed: number) {
  let s = seed >>> 0
  return () => {
    s = (s + 0x6D2B79F5) >>> 0
    let t = Math.imul(s ^ (s >>> 15), 1 | s)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** A busy sketch: mostly pencil work along curves inside the disk, some shading, a few erasures and fills. */
function benchStrokes(count: number): Stroke[] {
  const next = random(42)
  const strokes: Stroke[] = []
  for (let n = 0; n < count; n++) {
    const kind = n % 100
    const length = 60 + Math.floor(next() * 81)
    let angle = next() * Math.PI * 2
    const r0 = Math.sqrt(next()) * 760
    let x = 1024 + r0 * Math.cos(angle)
    let y = 1024 + r0 * Math.sin(angle)
    const points: number[] = []
    for (let i = 0; i < length; i++) {
      angle += (next() - 0.5) * 0.5
      x = Math.min(2000, Math.max(48, x + Math.cos(angle) * 3))
      y = Math.min(2000, Math.max(48, y + Math.sin(angle) * 3))
      points.push(Math.round(x * 10) / 10, Math.round(y * 10) / 10, Math.round((0.3 + 0.6 * Math.sin(i / length * Math.PI)) * 100) / 100)
    }
    const id = `b${n}`
    const tone = Math.round(next() * 4) / 4
    if (kind < 90) strokes.push({ id, tool: 'pencil', tone, size: 3 + Math.floor(next() * 10), pen: true, points })
    else if (kind < 97) strokes.push({ id, tool: 'shade', tone, size: 60 + Math.floor(next() * 90), points })
    else if (kind < 99) strokes.push({ id, tool: 'eraser', size: 20 + Math.floor(next() * 30), pen: true, points })
    else strokes.push({ id, tool: 'fill', tone, points })
  }
  return strokes
}

async function pageBundle(): Promise<string> {
  const out = await build({
    configFile: false,
    logLevel: 'silent',
    root: ROOT,
    resolve: { alias: { '#shared': resolve(ROOT, 'shared') } },
    build: { write: false, minify: false, lib: { entry: resolve(ROOT, 'bench/sketch-page.ts'), formats: ['iife'], name: 'sketchBenchBundle' } },
  })
  const result = Array.isArray(out) ? out[0]! : out
  if (!('output' in result)) throw new Error('The page bundle did not build')
  return result.output[0].code
}

async function multipartSave(url: string, cookie: string, id: string, baseVersion: number, shapes: string, png: Buffer) {
  const form = new FormData()
  form.set('baseVersion', String(baseVersion))
  form.set('saveId', randomUUID())
  form.set('orientation', 'zenith-up')
  form.set('flip', 'none')
  form.set('shapes', shapes)
  form.set('raster', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'sketch.png')
  const start = performance.now()
  const response = await fetch(`${url}/api/sketches/${id}`, { method: 'PUT', headers: { cookie }, body: form })
  const ms = performance.now() - start
  if (response.status !== 200) throw new Error(`save answered ${response.status}: ${await response.text()}`)
  return { ms, version: (await response.json() as { version: number }).version }
}

/** What any save of this raster must do: sharp's decode and three WebP encodes, and the three S3 puts. */
async function bareSave(store: ReturnType<typeof createObjectStore>, png: Buffer): Promise<number> {
  const start = performance.now()
  const decoded = await sharp(png).raw().toBuffer({ resolveWithObject: true })
  const raw = { raw: { width: decoded.info.width, height: decoded.info.height, channels: decoded.info.channels } }
  const [full, large, small] = await Promise.all([
    sharp(decoded.data, raw).webp({ quality: 90, effort: 4 }).toBuffer(),
    sharp(decoded.data, raw).resize(512, 512, { kernel: 'lanczos3' }).webp({ quality: 82, effort: 4 }).toBuffer(),
    sharp(decoded.data, raw).resize(256, 256, { kernel: 'lanczos3' }).webp({ quality: 82, effort: 4 }).toBuffer(),
  ])
  const prefix = `bench/${randomUUID()}`
  await Promise.all([
    store.put(`${prefix}/full.webp`, full, 'image/webp'),
    store.put(`${prefix}/thumb-512.webp`, large, 'image/webp'),
    store.put(`${prefix}/thumb-256.webp`, small, 'image/webp'),
  ])
  return performance.now() - start
}

async function main() {
  const strokes = benchStrokes(STROKES)
  const points = strokes.reduce((sum, s) => sum + s.points.length / 3, 0)
  const shapes = JSON.stringify({ ...emptyShapes(), strokes })
  const app = await startApp()
  const browser = await launchBrowser()
  const s3Dir = mkdtempSync(join(tmpdir(), 'shadowline-bench-s3-'))
  const s3 = await startEmbeddedS3(s3Dir, 0)
  try {
    const observationId = insertObservation(app.dataDir, { email: DEMO.observer.email, observedAt: '2026-02-23T19:00:00Z' })
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    const signIn = await context.request.post(`${app.url}/api/auth/sign-in`, { data: { email: DEMO.observer.email, password: DEMO.observer.password } })
    if (signIn.status() !== 200) throw new Error('sign-in failed')
    const cookie = (await context.cookies()).map(c => `${c.name}=${c.value}`).join('; ')
    const { id } = await (await context.request.post(`${app.url}/api/sketches`, { data: { observationId } })).json() as { id: string }
    const placeholder = await sharp({ create: { width: 2048, height: 2048, channels: 3, background: '#000' } }).png().toBuffer()
    let version = (await multipartSave(app.url, cookie, id, 1, shapes, placeholder)).version

    // 1. Render.
    const bundle = await pageBundle()
    const page = await context.newPage()
    const editor: { paintMs: number, openToPaintMs: number }[] = []
    const bare: number[] = []
    for (let run = 0; run < RENDER_RUNS; run++) {
      await page.goto(`${app.url}/sketches/${id}`)
      await page.waitForFunction(() => performance.getEntriesByName('sketch:painted').length > 0, undefined, { timeout: 120_000 })
      editor.push(await page.evaluate(() => {
        const opened = performance.getEntriesByName('sketch:opened')[0]!.startTime
        const painted = performance.getEntriesByName('sketch:painted')[0]!.startTime
        return { paintMs: painted - opened, openToPaintMs: painted }
      }))
      await page.addScriptTag({ content: bundle })
      bare.push(await page.evaluate(async (pageId) => {
        const detail = await (await fetch(`/api/sketches/${pageId}`)).json()
        // The same pixel size and transform as the editor's drawing layer at its fitted zoom.
        const canvas = document.querySelectorAll<HTMLCanvasElement>('[data-testid="sketch-canvas"] canvas')[1]!
        const host = document.querySelector<HTMLElement>('[data-testid="sketch-canvas"]')!
        const ratio = canvas.width / host.clientWidth
        const scale = Math.min(host.clientWidth, host.clientHeight) / 2048 * 0.96 * ratio
        const x = (host.clientWidth * ratio) / 2 - 1024 * scale
        const y = (host.clientHeight * ratio) / 2 - 1024 * scale
        return window.sketchBench.paintBare(detail.shapes.strokes, canvas.width, canvas.height, [scale, 0, 0, scale, x, y])
      }, id))
    }
    const rasterBase64 = await page.evaluate(async (pageId) => {
      const detail = await (await fetch(`/api/sketches/${pageId}`)).json()
      return window.sketchBench.raster(detail.shapes.strokes)
    }, id)
    const png = Buffer.from(rasterBase64, 'base64')
    await context.close()

    // 2. Save, the full request: the 2,000-stroke drawing and its raster; then with an empty drawing, to
    // show the raster path on its own; then the bare work. The three are interleaved run by run, so the load
    // other work puts on the machine falls on all of them alike.
    const store = createObjectStore({ endpoint: s3.endpoint, region: 'us-east-1', bucket: 'shadowline-bench', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true })
    await store.ensureBucket()
    const emptyDrawing = JSON.stringify(emptyShapes())
    const saves: number[] = []
    const rasterOnlySaves: number[] = []
    const bareSaves: number[] = []
    for (let run = 0; run < SAVE_RUNS; run++) {
      let saved = await multipartSave(app.url, cookie, id, version, shapes, png)
      saves.push(saved.ms)
      saved = await multipartSave(app.url, cookie, id, saved.version, emptyDrawing, png)
      rasterOnlySaves.push(saved.ms)
      version = saved.version
      bareSaves.push(await bareSave(store, png))
    }

    const renderMs = median(editor.map(e => e.paintMs))
    const bareMs = median(bare)
    const result = {
      generatedAt: new Date().toISOString(),
      machine: { cpu: cpus()[0]?.model ?? 'unknown', cores: cpus().length, node: process.version, os: `${platform()} ${release()}` },
      library: {
        'konva': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/konva/package.json'), 'utf8')).version,
        'vue-konva': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/vue-konva/package.json'), 'utf8')).version,
        'perfect-freehand': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/perfect-freehand/package.json'), 'utf8')).version,
        'sharp': sharp.versions.sharp,
        'chromium': browser.version(),
      },
      ratios: {
        renderVsBareCanvas: round(renderMs / bareMs),
        saveVsBareSharpS3: round(median(saves) / median(bareSaves)),
        saveEmptyDrawingVsBareSharpS3: round(median(rasterOnlySaves) / median(bareSaves)),
      },
      render: {
        description: 'Editor in headless chromium (no GPU), 1280×800 window: from the sketch opened in the store to its drawing layer painted, against the same strokes painted on a bare canvas by the same painter.',
        strokes: strokes.length,
        points,
        runs: RENDER_RUNS,
        medianMs: { editorFirstFullRender: round(renderMs), bareCanvas: round(bareMs), navigationToPainted: round(median(editor.map(e => e.openToPaintMs))) },
        runsMs: { editor: editor.map(e => round(e.paintMs)), bareCanvas: bare.map(round) },
      },
      save: {
        description: 'PUT /api/sketches/[id] (multipart) with the editor\'s 2048² PNG, measured by the client, against sharp decode + WebP image + 512/256 thumbnails + 3 S3 puts in this process.',
        rasterPngBytes: png.length,
        shapesJsonBytes: shapes.length,
        runs: SAVE_RUNS,
        medianMs: { save: round(median(saves)), saveEmptyDrawing: round(median(rasterOnlySaves)), bareSharpS3: round(median(bareSaves)) },
        runsMs: { save: saves.map(round), saveEmptyDrawing: rasterOnlySaves.map(round), bareSharpS3: bareSaves.map(round) },
      },
    }
    mkdirSync(resolve(ROOT, 'bench/results'), { recursive: true })
    writeFileSync(resolve(ROOT, 'bench/results/sketch.json'), `${JSON.stringify(result, null, 2)}\n`)
    console.log(JSON.stringify({ ratios: result.ratios, render: result.render.medianMs, save: result.save.medianMs }, null, 2))
  }
  finally {
    await browser.close()
    await app.stop()
    await s3.close()
    rmSync(s3Dir, { recursive: true, force: true })
  }
}

await main()
