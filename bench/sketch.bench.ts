// Benchmark of the sketch desk and its saves. A script, not a test: timings vary with the machine and never
// gate anything.   npm run bench:sketch   (after `npm run build`) → prints the figures and writes
// bench/results/sketch.json. Every ratio is measured side by side in one run, so load from other work on
// the machine falls on both sides alike; the absolute figures are beside them.
//
// 1. Render: the built app opens a sketch of 2,000 strokes (about 200,000 points) in headless chromium. The
//    editor marks when the sketch is opened (strokes in the store, before the canvas exists) and when its
//    drawing layer has painted every stroke ('sketch:opened', 'sketch:painted'); the script waits for both.
//    The same strokes are then painted on a bare canvas 2D context by the same painter.
// 2. Bytes per autosave: in that editor one more stroke is drawn with the mouse and saved; the request body
//    the editor sent is weighed against that one stroke's JSON.
// 3. Pen-to-ink latency: the editor at 2,000 strokes with chromium's CPU slowed 4× (DevTools protocol), 500
//    pointer events in strokes of 25; from each event's timestamp to the end of the frame that paints it.
//    Baseline: the same painter on a bare canvas (committed strokes below, the stroke in progress above).
// 4. Save: the whole 2,000-stroke drawing saved (PUT) and a one-stroke autosave (PATCH), measured by the
//    client, against the work neither can avoid done in this process: parsing and checking the JSON, and
//    for the autosave applying the step to the stored drawing; then writing the text to SQLite.
// 5. Stored per session: a scripted 300-stroke session autosaving every 2–3 strokes; then its image and
//    thumbnails are asked for. Every byte the sketch holds in the database and the object store, against
//    the final drawing's JSON plus one image and its two thumbnails.
// 6. Capacity: 40 simulated tablets autosave one or two new strokes every 5 s for 60 s, and two writers race
//    on one sketch (taking the 409 and sending again on the new version); each also asks the trivial JSON
//    route (/api/health) between saves. Acknowledged saves lost, 5xx answers, p95 latencies.

import { randomUUID } from 'node:crypto'
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { cpus, loadavg, platform, release, tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import Database from 'better-sqlite3'
import sharp from 'sharp'
import type { Page } from 'playwright-core'
import type { SketchStep } from '../shared/sketch/operations'
import { lunarCircumstances } from '../shared/lunar'
import { SketchOperationsBody, applySteps } from '../shared/sketch/operations'
import { SketchShapes, emptyShapes } from '../shared/sketch/schema'
import type { Stroke } from '../shared/sketch/schema'
import { DEMO, startApp } from '../tests/support/app'
import { launchBrowser } from '../tests/support/browser'
import { insertObservation } from '../tests/support/observations'
import { painterBundle } from '../tests/support/painter'

const ROOT = resolve(import.meta.dirname, '..')
const STROKES = 2000
const RENDER_RUNS = 5
const SAVE_RUNS = 9
const LATENCY_EVENTS = 500
const SESSION_STROKES = 300
const TABLETS = 40
const CAPACITY_MS = 60_000
const TICK_MS = 5000

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}
const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.min(sorted.length - 1, Math.ceil(p / 100 * sorted.length) - 1)]!
}
const round = (value: number) => Math.round(value * 100) / 100
const sleep = (ms: number) => new Promise(done => setTimeout(done, ms))

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

/** A signed-in HTTP client for the built app. */
class Http {
  constructor(readonly base: string, readonly cookie: string) {}
  async json(method: string, path: string, body?: unknown) {
    const start = performance.now()
    const send = () => fetch(this.base + path, {
      method,
      headers: { cookie: this.cookie, accept: 'application/json', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
    // A kept-alive connection the server closed just as it was reused fails before any answer. Sending the
    // same request again is safe: a save carries its id, and lands once however often it is sent.
    const response = await send().catch(send).catch(send)
    const text = await response.text()
    const ms = performance.now() - start
    let parsed: any = null // eslint-disable-line @typescript-eslint/no-explicit-any -- the answers' shapes vary by route
    try {
      parsed = JSON.parse(text)
    }
    catch { /* not JSON */ }
    return { status: response.status, body: parsed, ms }
  }
}

async function newSketch(http: Http, observationId: string): Promise<string> {
  const created = await http.json('POST', '/api/sketches', { observationId })
  if (created.status !== 201) throw new Error(`sketch not created: ${created.status}`)
  return created.body.id
}

async function saveWhole(http: Http, id: string, baseVersion: number, strokes: Stroke[]) {
  const answer = await http.json('PUT', `/api/sketches/${id}`, { baseVersion, saveId: randomUUID(), orientation: 'zenith-up', flip: 'none', shapes: { ...emptyShapes(), strokes } })
  if (answer.status !== 200) throw new Error(`whole save answered ${answer.status}: ${JSON.stringify(answer.body)}`)
  return { version: answer.body.version as number, ms: answer.ms }
}

async function saveSteps(http: Http, id: string, baseVersion: number, steps: SketchStep[]) {
  const answer = await http.json('PATCH', `/api/sketches/${id}`, { baseVersion, saveId: randomUUID(), steps })
  if (answer.status !== 200) throw new Error(`autosave answered ${answer.status}: ${JSON.stringify(answer.body)}`)
  return { version: answer.body.version as number, ms: answer.ms }
}

/** A new stroke with a fresh id, for the sessions and tablets: one of the bench strokes, renamed. */
function freshStroke(pool: Stroke[], n: number, prefix: string): Stroke {
  return { ...pool[n % pool.length]!, id: `${prefix}${n}` }
}

// ---- 1 and 2: render, and bytes per autosave ----

async function measureRender(page: Page, url: string, id: string, bundle: string) {
  const editor: { paintMs: number, navigationToPaintedMs: number }[] = []
  const bare: number[] = []
  for (let run = 0; run < RENDER_RUNS; run++) {
    await page.goto(`${url}/sketches/${id}`)
    await page.waitForFunction(() => performance.getEntriesByName('sketch:opened').length > 0 && performance.getEntriesByName('sketch:painted').length > 0, undefined, { timeout: 180_000 })
    editor.push(await page.evaluate(() => {
      const opened = performance.getEntriesByName('sketch:opened')[0]!.startTime
      const painted = performance.getEntriesByName('sketch:painted')[0]!.startTime
      return { paintMs: painted - opened, navigationToPaintedMs: painted }
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
      return window.sketchPainter.paintBare(detail.shapes.strokes, canvas.width, canvas.height, [scale, 0, 0, scale, x, y])
    }, id))
  }
  return { editor, bare }
}

async function measureAutosaveBytes(page: Page, url: string, id: string) {
  await page.goto(`${url}/sketches/${id}`)
  await page.waitForFunction(() => performance.getEntriesByName('sketch:painted').length > 0, undefined, { timeout: 180_000 })
  const sent = page.waitForRequest(request => request.url().endsWith(`/api/sketches/${id}`) && ['PATCH', 'PUT'].includes(request.method()), { timeout: 60_000 })
  const box = (await page.getByTestId('sketch-canvas').boundingBox())!
  await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.5)
  await page.mouse.down()
  for (let i = 1; i <= 30; i++) await page.mouse.move(box.x + box.width * (0.4 + i * 0.006), box.y + box.height * (0.5 + 0.05 * Math.sin(i / 4)), { steps: 2 })
  await page.mouse.up()
  // The autosave follows a moment's pause.
  const request = await sent
  const response = await request.response()
  if (response?.status() !== 200) throw new Error(`the editor's autosave answered ${response?.status()}`)
  const body = request.postDataBuffer()?.length ?? 0
  const headers = (await request.headersArray()).reduce((sum, h) => sum + h.name.length + h.value.length + 4, 0)
  const detail = await (await page.request.get(`${url}/api/sketches/${id}`)).json() as { shapes: { strokes: Stroke[] } }
  const stroke = JSON.stringify(detail.shapes.strokes.at(-1))
  return { method: request.method(), bodyBytes: body, headerBytes: headers, strokeJsonBytes: stroke.length, strokePoints: detail.shapes.strokes.at(-1)!.points.length / 3 }
}

// ---- 3: pen-to-ink latency ----

/** Records, for every pointer event, the time from its timestamp to the end of the frame that shows it. */
async function installLatencyProbe(page: Page) {
  await page.evaluate(() => {
    const samples: number[] = []
    ;(window as unknown as { inkLatency: number[] }).inkLatency = samples
    window.addEventListener('pointermove', (event) => {
      const t0 = event.timeStamp
      // rAF callbacks run, then the frame is painted; a message posted from the callback runs after that.
      requestAnimationFrame(() => {
        const channel = new MessageChannel()
        channel.port1.onmessage = () => samples.push(performance.now() - t0)
        channel.port2.postMessage(0)
      })
    }, { capture: true })
  })
}

async function penStrokes(page: Page, box: { x: number, y: number, width: number, height: number }) {
  const cdp = await page.context().newCDPSession(page)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 })
  const perStroke = 25
  for (let s = 0; s < LATENCY_EVENTS / perStroke; s++) {
    const x0 = box.x + box.width * (0.3 + 0.02 * (s % 10))
    const y0 = box.y + box.height * (0.3 + 0.02 * s)
    const at = (i: number) => ({ x: x0 + i * 6, y: y0 + 12 * Math.sin(i / 4) })
    await cdp.send('Input.dispatchMouseEvent', { type: 'mousePressed', ...at(0), button: 'left', buttons: 1, clickCount: 1, pointerType: 'pen', force: 0.5 } as never)
    for (let i = 1; i <= perStroke; i++) {
      await cdp.send('Input.dispatchMouseEvent', { type: 'mouseMoved', ...at(i), button: 'left', buttons: 1, pointerType: 'pen', force: 0.5 } as never)
      // A pen reports about every 8 ms; a round trip here takes longer, so the events come no faster.
      await sleep(8)
    }
    await cdp.send('Input.dispatchMouseEvent', { type: 'mouseReleased', ...at(perStroke), button: 'left', buttons: 0, clickCount: 1, pointerType: 'pen', force: 0 } as never)
    await sleep(50)
  }
  await sleep(500)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 })
  await cdp.detach()
  return page.evaluate(() => (window as unknown as { inkLatency: number[] }).inkLatency.slice())
}

async function measurePenLatency(page: Page, url: string, id: string, bundle: string, strokes: Stroke[]) {
  await page.goto(`${url}/sketches/${id}`)
  await page.waitForFunction(() => performance.getEntriesByName('sketch:painted').length > 0, undefined, { timeout: 180_000 })
  const box = (await page.getByTestId('sketch-canvas').boundingBox())!
  await installLatencyProbe(page)
  const editor = await penStrokes(page, box)

  await page.goto(`${url}/api/health`)
  await page.setContent('<!doctype html><title>bare</title><body style="margin:0">')
  await page.addScriptTag({ content: bundle })
  // The editor's fitted transform at this window size, in canvas pixels.
  await page.evaluate(([s, b]) => {
    const ratio = devicePixelRatio
    const scale = Math.min(b.width, b.height) / 2048 * 0.96 * ratio
    window.sketchPainter.bareEditor(s, [scale, 0, 0, scale, (b.x + b.width / 2) * ratio - 1024 * scale, (b.y + b.height / 2) * ratio - 1024 * scale])
  }, [strokes, box] as const)
  await installLatencyProbe(page)
  const bare = await penStrokes(page, box)
  return { editor, bare }
}

// ---- 4: save against the bare work ----

function bareWholeSave(db: Database.Database, text: string): number {
  const start = performance.now()
  const shapes = SketchShapes.parse(JSON.parse(text))
  db.prepare('update drawing set shapes = ?, version = version + 1 where id = 1').run(JSON.stringify(shapes))
  return performance.now() - start
}

function bareAutosave(db: Database.Database, body: string, geometry: ReturnType<typeof lunarCircumstances>): number {
  const start = performance.now()
  const save = SketchOperationsBody.parse(JSON.parse(body))
  const stored = db.prepare('select shapes from drawing where id = 1').get() as { shapes: string }
  const next = applySteps({ strokes: (JSON.parse(stored.shapes) as { strokes: Stroke[] }).strokes, view: { orientation: 'zenith-up', flip: 'none' } }, save.steps, geometry)
  const text = JSON.stringify({ ...emptyShapes(), strokes: next.strokes })
  db.transaction(() => {
    db.prepare('update drawing set shapes = ?, version = version + 1 where id = 1').run(text)
    db.prepare('insert into steps (operations) values (?)').run(JSON.stringify(save.steps))
  })()
  return performance.now() - start
}

// ---- 5: bytes stored for a session ----

function storedBytes(dataDir: string, id: string) {
  const db = new Database(join(dataDir, 'shadowline.sqlite'), { readonly: true })
  try {
    const sketch = db.prepare('select length(shapes) as shapes, raster_key, thumb_large_key, thumb_small_key from sketches where id = ?').get(id) as { shapes: number, raster_key: string, thumb_large_key: string, thumb_small_key: string }
    const history = db.prepare('select coalesce(sum(length(shapes)), 0) + coalesce(sum(length(operations)), 0) as bytes, count(*) as rows, sum(checkpoint is not null) as checkpoints from sketch_revisions where sketch_id = ?').get(id) as { bytes: number, rows: number, checkpoints: number }
    const root = join(dataDir, 's3', 'shadowline')
    const objectSize = (key: string) => statSync(join(root, `${key}._S3rver_object`)).size
    const walk = (dir: string): string[] => readdirSync(dir, { withFileTypes: true }).flatMap(e => (e.isDirectory() ? walk(join(dir, e.name)) : [join(dir, e.name)]))
    const objects = walk(join(root, 'sketches', id)).filter(f => f.endsWith('._S3rver_object')).reduce((sum, f) => sum + statSync(f).size, 0)
    const images = objectSize(sketch.raster_key) + objectSize(sketch.thumb_large_key) + objectSize(sketch.thumb_small_key)
    return { sketchShapes: sketch.shapes, history: history.bytes, historyRows: history.rows, checkpoints: history.checkpoints, objects, finalImages: images }
  }
  finally {
    db.close()
  }
}

// ---- 6: capacity ----

interface Tally { saves: number[], trivial: number[], fiveXX: number, refused: number, other: number }

async function tablet(http: Http, id: string, pool: Stroke[], name: string, until: number, acknowledged: Set<string>, tally: Tally, racing: boolean) {
  let version = 1
  let n = 0
  await sleep(racing ? 0 : Math.random() * TICK_MS)
  while (Date.now() < until) {
    const tickStart = Date.now()
    const count = 1 + (n % 2)
    const strokes = Array.from({ length: count }, (_, i) => freshStroke(pool, n * 2 + i, name))
    n++
    for (let attempt = 0; attempt < 5; attempt++) {
      const answer = await http.json('PATCH', `/api/sketches/${id}`, { baseVersion: version, saveId: randomUUID(), steps: strokes.map(stroke => ({ op: 'add', stroke })) })
      if (answer.status >= 500) tally.fiveXX++
      if (answer.status === 200) {
        tally.saves.push(answer.ms)
        version = answer.body.version
        for (const s of strokes) acknowledged.add(`${id}:${s.id}`)
        break
      }
      if (answer.status === 409 && answer.body?.data?.currentVersion) {
        // The other writer landed first: send the same strokes again on the version it made.
        tally.refused++
        tally.saves.push(answer.ms)
        version = answer.body.data.currentVersion
        continue
      }
      tally.other++
      break
    }
    await sleep(Math.max(0, TICK_MS / 2 - (Date.now() - tickStart)))
    const trivial = await http.json('GET', '/api/health')
    if (trivial.status >= 500) tally.fiveXX++
    tally.trivial.push(trivial.ms)
    await sleep(Math.max(0, TICK_MS - (Date.now() - tickStart)))
  }
}

async function measureCapacity(http: Http, observationId: string, pool: Stroke[]) {
  const ids = await Promise.all(Array.from({ length: TABLETS }, () => newSketch(http, observationId)))
  const raced = await newSketch(http, observationId)
  const acknowledged = new Set<string>()
  const tally: Tally = { saves: [], trivial: [], fiveXX: 0, refused: 0, other: 0 }
  const until = Date.now() + CAPACITY_MS
  await Promise.all([
    ...ids.map((id, i) => tablet(http, id, pool, `t${i}x`, until, acknowledged, tally, false)),
    tablet(http, raced, pool, 'ra', until, acknowledged, tally, true),
    tablet(http, raced, pool, 'rb', until, acknowledged, tally, true),
  ])
  let lost = 0
  let duplicated = 0
  for (const id of [...ids, raced]) {
    const strokes = ((await http.json('GET', `/api/sketches/${id}`)).body.shapes.strokes as Stroke[]).map(s => `${id}:${s.id}`)
    const held = new Set(strokes)
    duplicated += strokes.length - held.size
    for (const key of acknowledged) if (key.startsWith(`${id}:`) && !held.has(key)) lost++
  }
  return { acknowledged: acknowledged.size, lost, duplicated, tally }
}

async function main() {
  const strokes = benchStrokes(STROKES)
  const points = strokes.reduce((sum, s) => sum + s.points.length / 3, 0)
  const shapesText = JSON.stringify({ ...emptyShapes(), strokes })
  const loadBefore = loadavg()
  const app = await startApp()
  const browser = await launchBrowser()
  const scratch = mkdtempSync(join(tmpdir(), 'shadowline-bench-sketch-'))
  try {
    const observedAt = '2026-02-23T19:00:00Z'
    const observationId = insertObservation(app.dataDir, { email: DEMO.observer.email, observedAt })
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    const signIn = await context.request.post(`${app.url}/api/auth/sign-in`, { data: { email: DEMO.observer.email, password: DEMO.observer.password } })
    if (signIn.status() !== 200) throw new Error('sign-in failed')
    const http = new Http(app.url, (await context.cookies()).map(c => `${c.name}=${c.value}`).join('; '))
    const id = await newSketch(http, observationId)
    let version = (await saveWhole(http, id, 1, strokes)).version

    // 1, 2: render, and the bytes of one autosave.
    const bundle = await painterBundle()
    const page = await context.newPage()
    const render = await measureRender(page, app.url, id, bundle)
    const autosave = await measureAutosaveBytes(page, app.url, id)
    await page.close()

    // 3: pen-to-ink latency, on a sketch of exactly the 2,000 strokes.
    const penId = await newSketch(http, observationId)
    await saveWhole(http, penId, 1, strokes)
    const penPage = await context.newPage()
    const pen = await measurePenLatency(penPage, app.url, penId, bundle, strokes)
    await penPage.close()
    await context.close()

    // 4: saves against the bare work, interleaved run by run.
    const scratchDb = new Database(join(scratch, 'bare.sqlite'))
    scratchDb.pragma('journal_mode = WAL')
    scratchDb.exec('create table drawing (id integer primary key, version integer, shapes text); create table steps (operations text)')
    scratchDb.prepare('insert into drawing values (1, 1, ?)').run(shapesText)
    const geometry = lunarCircumstances(new Date(observedAt), { latitude: 52.634, longitude: -1.692, elevation: 95 })
    version = (await http.json('GET', `/api/sketches/${id}`)).body.version
    const whole: number[] = []
    const bareWhole: number[] = []
    const steps: number[] = []
    const bareSteps: number[] = []
    for (let run = 0; run < SAVE_RUNS; run++) {
      const saved = await saveWhole(http, id, version, strokes)
      whole.push(saved.ms)
      bareWhole.push(bareWholeSave(scratchDb, shapesText))
      const stroke = freshStroke(strokes, run, 'save')
      const step = await saveSteps(http, id, saved.version, [{ op: 'add', stroke }])
      version = step.version
      steps.push(step.ms)
      bareSteps.push(bareAutosave(scratchDb, JSON.stringify({ baseVersion: saved.version, saveId: randomUUID(), steps: [{ op: 'add', stroke: { ...stroke, id: `bare${run}` } }] }), geometry))
    }
    scratchDb.close()

    // 5: a 300-stroke session with an autosave every 2–3 strokes, then its image and thumbnails.
    const sessionId = await newSketch(http, observationId)
    let sessionVersion = 1
    let sessionSaves = 0
    let sessionSentBytes = 0
    for (let n = 0; n < SESSION_STROKES;) {
      const batch = Array.from({ length: Math.min(2 + (sessionSaves % 2), SESSION_STROKES - n) }, (_, i) => strokes[n + i]!)
      const body = { baseVersion: sessionVersion, saveId: randomUUID(), steps: batch.map(stroke => ({ op: 'add' as const, stroke })) }
      sessionSentBytes += JSON.stringify(body).length
      sessionVersion = (await saveSteps(http, sessionId, sessionVersion, body.steps)).version
      n += batch.length
      sessionSaves++
    }
    for (const path of ['raster', 'thumbnail?size=512', 'thumbnail']) {
      const image = await fetch(`${app.url}/api/sketches/${sessionId}/${path}`, { headers: { cookie: http.cookie } })
      if (image.status !== 200) throw new Error(`image ${path} answered ${image.status}`)
      await sharp(Buffer.from(await image.arrayBuffer())).metadata()
    }
    const stored = storedBytes(app.dataDir, sessionId)
    const sessionFinal = stored.sketchShapes + stored.finalImages
    const sessionStored = stored.sketchShapes + stored.history + stored.objects

    // 6: capacity.
    const capacity = await measureCapacity(http, observationId, strokes)
    const loadAfter = loadavg()

    const renderMs = median(render.editor.map(e => e.paintMs))
    const bareMs = median(render.bare)
    const penEditorP95 = percentile(pen.editor, 95)
    const penBareP95 = percentile(pen.bare, 95)
    const saveP95 = percentile(capacity.tally.saves, 95)
    const trivialP95 = percentile(capacity.tally.trivial, 95)
    const result = {
      generatedAt: new Date().toISOString(),
      machine: {
        cpu: cpus()[0]?.model ?? 'unknown',
        cores: cpus().length,
        node: process.version,
        os: `${platform()} ${release()}`,
        loadAverage1mBeforeAndAfter: [round(loadBefore[0]!), round(loadAfter[0]!)],
        note: 'Absolute figures depend on what else the machine runs; the ratios compare two things measured side by side in one run.',
      },
      library: {
        'konva': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/konva/package.json'), 'utf8')).version,
        'vue-konva': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/vue-konva/package.json'), 'utf8')).version,
        'perfect-freehand': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/perfect-freehand/package.json'), 'utf8')).version,
        '@napi-rs/canvas': JSON.parse(readFileSync(resolve(ROOT, 'node_modules/@napi-rs/canvas/package.json'), 'utf8')).version,
        'sharp': sharp.versions.sharp,
        'chromium': browser.version(),
      },
      goals: { bytesPerAutosaveVsStroke: 2, sessionStoredVsFinal: 3, penLatencyP95VsBare: 1.5, capacitySaveP95VsTrivial: 5, renderVsBareCanvas: 2, saveVsBare: 1.3 },
      ratios: {
        bytesPerAutosaveVsStroke: round(autosave.bodyBytes / autosave.strokeJsonBytes),
        sessionStoredVsFinal: round(sessionStored / sessionFinal),
        penLatencyP95VsBare: round(penEditorP95 / penBareP95),
        capacitySaveP95VsTrivial: round(saveP95 / trivialP95),
        renderVsBareCanvas: round(renderMs / bareMs),
        saveVsBare: round(median(whole) / median(bareWhole)),
        autosaveVsBare: round(median(steps) / median(bareSteps)),
      },
      autosave: {
        description: 'One stroke drawn with the mouse in the editor at 2,000 strokes and saved; the request the editor sent, against that stroke\'s JSON.',
        ...autosave,
        wholeDrawingJsonBytes: shapesText.length,
      },
      session: {
        description: `${SESSION_STROKES} strokes, an autosave every 2–3 strokes, then the image and thumbnails read once: everything stored for the sketch (its row's drawing, the history rows, every object) against the final drawing plus one image and two thumbnails.`,
        saves: sessionSaves,
        sentBytes: sessionSentBytes,
        storedBytes: sessionStored,
        finalBytes: sessionFinal,
        ...stored,
      },
      penLatency: {
        description: `Editor at ${STROKES} strokes and a bare canvas with the same painter, chromium CPU slowed 4×, ${LATENCY_EVENTS} pen moves in strokes of 25: event timestamp to the end of the frame that paints it.`,
        events: { editor: pen.editor.length, bare: pen.bare.length },
        p50Ms: { editor: round(percentile(pen.editor, 50)), bare: round(percentile(pen.bare, 50)) },
        p95Ms: { editor: round(penEditorP95), bare: round(penBareP95) },
        editorP95VsOneFrameAt60Hz: round(penEditorP95 / (1000 / 60)),
      },
      capacity: {
        description: `${TABLETS} tablets autosaving 1–2 new strokes every ${TICK_MS / 1000} s for ${CAPACITY_MS / 1000} s, plus two writers racing on one sketch; each asks /api/health between saves.`,
        acknowledgedStrokes: capacity.acknowledged,
        lostAcknowledged: capacity.lost,
        duplicatedStrokes: capacity.duplicated,
        fiveXX: capacity.tally.fiveXX,
        conflictsRetried: capacity.tally.refused,
        otherRefusals: capacity.tally.other,
        saves: capacity.tally.saves.length,
        p50Ms: { save: round(percentile(capacity.tally.saves, 50)), trivial: round(percentile(capacity.tally.trivial, 50)) },
        p95Ms: { save: round(saveP95), trivial: round(trivialP95) },
      },
      render: {
        description: 'Editor in headless chromium (no GPU), 1280×800 window: from the sketch opened in the store (before the canvas exists) to its drawing layer painted, against the same strokes painted on a bare canvas by the same painter.',
        strokes: strokes.length,
        points,
        runs: RENDER_RUNS,
        medianMs: { editorFirstFullRender: round(renderMs), bareCanvas: round(bareMs), navigationToPainted: round(median(render.editor.map(e => e.navigationToPaintedMs))) },
        runsMs: { editor: render.editor.map(e => round(e.paintMs)), bareCanvas: render.bare.map(round) },
      },
      save: {
        description: 'Whole 2,000-stroke save (PUT, JSON) and one-stroke autosave (PATCH) measured by the client, against the same parsing, checking, applying and SQLite writing in this process.',
        shapesJsonBytes: shapesText.length,
        runs: SAVE_RUNS,
        medianMs: { whole: round(median(whole)), bareWhole: round(median(bareWhole)), autosave: round(median(steps)), bareAutosave: round(median(bareSteps)) },
        runsMs: { whole: whole.map(round), bareWhole: bareWhole.map(round), autosave: steps.map(round), bareAutosave: bareSteps.map(round) },
      },
    }
    mkdirSync(resolve(ROOT, 'bench/results'), { recursive: true })
    writeFileSync(resolve(ROOT, 'bench/results/sketch.json'), `${JSON.stringify(result, null, 2)}\n`)
    console.log(JSON.stringify({ ratios: result.ratios, autosave: result.autosave, session: { stored: sessionStored, final: sessionFinal }, pen: result.penLatency.p95Ms, capacity: { lost: capacity.lost, fiveXX: capacity.tally.fiveXX, p95: result.capacity.p95Ms }, render: result.render.medianMs, save: result.save.medianMs, load: result.machine.loadAverage1mBeforeAndAfter }, null, 2))
    if (capacity.lost || capacity.tally.fiveXX || capacity.duplicated) throw new Error('Acknowledged saves were lost, duplicated, or answered 5xx')
  }
  finally {
    await browser.close()
    await app.stop()
    rmSync(scratch, { recursive: true, force: true })
  }
}

await main()
