// Benchmark of what each page weighs and how soon it paints on a phone. A script, not a test: timings vary
// with the machine and never gate anything.
//   npm run bench:weight               (after `npm run build`) → prints the figures, writes bench/results/weight.json
//   npm run bench:weight -- --baseline  also records this run as the "before" of later runs
//
// The built server with the demo data; Debian's chromium with a 390×844 phone viewport, CPU throttled 4× and
// a slow mobile network (150 ms latency, 1.6 Mbit/s down, 750 kbit/s up), all through the DevTools protocol
// (the "slow 4G" profile of Lighthouse's mobile runs). Every run is a first visit: a new browser context with
// an empty cache. For each page, medians over the runs of:
// - JS bytes and total bytes on the wire (encoded bytes as received, headers included, from Network events)
//   until the network is idle, so including the chunks Nuxt prefetches for linked pages; and, apart, the JS
//   requested before the page answered a tap (Resource Timing);
// - which libraries arrived (found by a string each one carries in its code: Konva, Chart.js, zod,
//   astronomy-engine);
// - largest contentful paint and layout shift (the browser's own LCP and layout-shift entries; layout shift
//   as the largest session window, as the Core Web Vitals define CLS);
// - the time until the page answers a tap: when the client has taken over the server-rendered HTML
//   (plugins/hydrated.client.ts), before which buttons and links do nothing the app handles.
// The anchor is the Core Web Vitals "good" line (web.dev/articles/vitals: LCP ≤ 2.5 s, INP ≤ 200 ms,
// CLS ≤ 0.1) and a 150 KB budget of JavaScript on the wire for a public page.

import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { cpus, platform, release } from 'node:os'
import { resolve } from 'node:path'
import type { BrowserContext, CDPSession } from 'playwright-core'
import { DEMO, startApp } from '../tests/support/app'
import { launchBrowser } from '../tests/support/browser'

const ROOT = resolve(import.meta.dirname, '..')
const OUT = resolve(ROOT, 'bench/results/weight.json')
const RUNS = 5
const JS_BUDGET_BYTES = 150 * 1024
const GOOD_LCP_MS = 2500
const GOOD_CLS = 0.1
const NETWORK = { offline: false, latency: 150, downloadThroughput: 1_600_000 / 8, uploadThroughput: 750_000 / 8 }
const CPU_SLOWDOWN = 4

/** A string each library's built code carries (checked against the built chunks), so its arrival shows. */
export const LIBRARY_MARKS = {
  konva: 'Konva warning: ',
  chartjs: 'Canvas is already in use',
  zod: 'ZodError',
  astronomyEngine: 'Neptune',
} as const
type Library = keyof typeof LIBRARY_MARKS

interface PageCase {
  name: string
  path: string
  signedIn: boolean
  public: boolean
}

interface Run {
  jsBytes: number
  jsBytesBeforeTapReady: number
  totalBytes: number
  requests: number
  libraries: Library[]
  lcpMs: number
  lcpElement: string
  cls: number
  tapReadyMs: number
  uncompressedAssets: string[]
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}
const round = (value: number, places = 0) => Math.round(value * 10 ** places) / 10 ** places

// Installed before any page script: records the moment the app takes over, and keeps the LCP and layout
// shift entries (buffered observers would do too; this keeps them after a soft navigation as well).
const PROBE = `
  window.__weight = { lcp: 0, lcpElement: '', shifts: [], hydratedAt: null }
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) {
      window.__weight.lcp = entry.startTime
      window.__weight.lcpElement = (entry.element ? entry.element.tagName.toLowerCase() : '?') + (entry.url ? ' ' + new URL(entry.url).pathname : '')
    }
  }).observe({ type: 'largest-contentful-paint', buffered: true })
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) {
      if (!entry.hadRecentInput) window.__weight.shifts.push({ at: entry.startTime, value: entry.value })
    }
  }).observe({ type: 'layout-shift', buffered: true })
  // The document may have no root element yet when this runs, so watch the document itself.
  new MutationObserver((changes, observer) => {
    if (document.documentElement && document.documentElement.dataset.hydrated === 'true') {
      window.__weight.hydratedAt = performance.now()
      observer.disconnect()
    }
  }).observe(document, { subtree: true, attributes: true, attributeFilter: ['data-hydrated'] })
`

interface Probe {
  lcp: number
  lcpElement: string
  shifts: { at: number, value: number }[]
  hydratedAt: number | null
}

/** CLS as the Core Web Vitals define it: the largest burst of shifts less than 1 s apart, within 5 s. */
function cumulativeShift(shifts: { at: number, value: number }[]): number {
  let best = 0
  let window = 0
  let start = -Infinity
  let last = -Infinity
  for (const shift of shifts) {
    if (shift.at - last > 1000 || shift.at - start > 5000) {
      window = 0
      start = shift.at
    }
    window += shift.value
    last = shift.at
    best = Math.max(best, window)
  }
  return best
}

async function measure(context: BrowserContext, url: string): Promise<Run> {
  const page = await context.newPage()
  const cdp: CDPSession = await context.newCDPSession(page)
  await cdp.send('Network.enable')
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: false })
  await cdp.send('Network.emulateNetworkConditions', NETWORK)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN })

  const responses = new Map<string, { url: string, type: string, encoding: string, length: number }>()
  const finished: { id: string, bytes: number }[] = []
  cdp.on('Network.responseReceived', (event) => {
    const headers = Object.fromEntries(Object.entries(event.response.headers).map(([k, v]) => [k.toLowerCase(), String(v)]))
    responses.set(event.requestId, { url: event.response.url, type: event.type, encoding: headers['content-encoding'] ?? '', length: Number(headers['content-length'] ?? 0) })
  })
  cdp.on('Network.loadingFinished', (event) => {
    finished.push({ id: event.requestId, bytes: event.encodedDataLength })
  })

  await page.addInitScript(PROBE)
  await page.goto(url, { waitUntil: 'load', timeout: 120_000 })
  await page.waitForSelector('html[data-hydrated="true"]', { state: 'attached', timeout: 120_000 })
  await page.waitForLoadState('networkidle', { timeout: 120_000 })
  // LCP stops at the first input; read it before anything touches the page.
  const probe = await page.evaluate(() => (window as unknown as { __weight: Probe }).__weight)
  // What the page needed before it answered a tap, apart from what it fetched afterwards for the pages it
  // links to (Nuxt prefetches those in idle time).
  const timings = await page.evaluate(() => performance.getEntriesByType('resource').map((entry) => {
    const resource = entry as PerformanceResourceTiming
    return { path: new URL(resource.name).pathname, startTime: resource.startTime, transferSize: resource.transferSize }
  }))
  const jsBytesBeforeTapReady = timings
    .filter(t => t.path.endsWith('.js') && t.startTime < (probe.hydratedAt ?? Infinity))
    .reduce((sum, t) => sum + t.transferSize, 0)

  let jsBytes = 0
  let totalBytes = 0
  const libraries = new Set<Library>()
  const uncompressedAssets: string[] = []
  for (const { id, bytes } of finished) {
    const response = responses.get(id)
    if (!response) continue
    totalBytes += bytes
    const path = new URL(response.url).pathname
    // Text assets of 1 KB or more should come compressed (the built server skips smaller ones; WOFF2 is
    // compressed inside).
    if (path.startsWith('/_nuxt/') && /\.(js|css)$/.test(path) && !response.encoding && response.length >= 1024) uncompressedAssets.push(path)
    // By name, not by the request's type: a <link rel="prefetch"> of a chunk is typed "Other".
    if (!path.endsWith('.js')) continue
    jsBytes += bytes
    const { body, base64Encoded } = await cdp.send('Network.getResponseBody', { requestId: id })
    const text = base64Encoded ? Buffer.from(body, 'base64').toString('utf8') : body
    for (const [library, mark] of Object.entries(LIBRARY_MARKS) as [Library, string][]) {
      if (text.includes(mark)) libraries.add(library)
    }
  }
  await page.close()
  return {
    jsBytes,
    jsBytesBeforeTapReady,
    totalBytes,
    requests: finished.length,
    libraries: [...libraries].sort(),
    lcpMs: probe.lcp,
    lcpElement: probe.lcpElement,
    cls: cumulativeShift(probe.shifts),
    tapReadyMs: probe.hydratedAt ?? Number.NaN,
    uncompressedAssets,
  }
}

async function main() {
  const baseline = process.argv.includes('--baseline')
  const app = await startApp()
  const browser = await launchBrowser()
  try {
    const atlas = await (await fetch(`${app.url}/api/atlas`)).json() as { items: { id: string }[] }
    const entryId = atlas.items[0]?.id
    if (!entryId) throw new Error('The demo atlas is empty')
    const observer = await browser.newContext()
    await observer.request.post(`${app.url}/api/auth/sign-in`, { data: DEMO.observer })
    const sketches = await (await observer.request.get(`${app.url}/api/sketches`)).json() as { items: { id: string, status: string }[] }
    await observer.close()
    const sketch = sketches.items.find(s => s.status === 'draft') ?? sketches.items[0]
    if (!sketch) throw new Error('The demo observer has no sketch')

    const cases: PageCase[] = [
      { name: 'home', path: '/', signedIn: false, public: true },
      { name: 'atlas', path: '/atlas', signedIn: false, public: true },
      { name: 'atlasEntry', path: `/atlas/${entryId}`, signedIn: false, public: true },
      { name: 'learn', path: '/learn', signedIn: false, public: true },
      { name: 'features', path: '/features', signedIn: false, public: true },
      { name: 'tonight', path: '/tonight', signedIn: true, public: false },
      { name: 'sketchDesk', path: `/sketches/${sketch.id}`, signedIn: true, public: false },
    ]

    const pages: Record<string, unknown> = {}
    const medians: Record<string, { jsBytes: number, lcpMs: number, cls: number }> = {}
    for (const item of cases) {
      const runs: Run[] = []
      for (let run = 0; run < RUNS; run++) {
        const context = await browser.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 3, isMobile: true, hasTouch: true })
        if (item.signedIn) {
          const signIn = await context.request.post(`${app.url}/api/auth/sign-in`, { data: DEMO.observer })
          if (signIn.status() !== 200) throw new Error('sign-in failed')
        }
        runs.push(await measure(context, app.url + item.path))
        await context.close()
      }
      const figures = {
        path: item.path.replace(/[0-9a-f-]{36}/, '[id]'),
        public: item.public,
        signedIn: item.signedIn,
        runs: RUNS,
        medianJsKB: round(median(runs.map(r => r.jsBytes)) / 1024, 1),
        medianJsBeforeTapReadyKB: round(median(runs.map(r => r.jsBytesBeforeTapReady)) / 1024, 1),
        medianTotalKB: round(median(runs.map(r => r.totalBytes)) / 1024, 1),
        medianRequests: median(runs.map(r => r.requests)),
        librariesLoaded: [...new Set(runs.flatMap(r => r.libraries))].sort(),
        konvaLoaded: runs.some(r => r.libraries.includes('konva')),
        medianLcpMs: round(median(runs.map(r => r.lcpMs))),
        lcpElements: [...new Set(runs.map(r => r.lcpElement))],
        medianCls: round(median(runs.map(r => r.cls)), 4),
        worstCls: round(Math.max(...runs.map(r => r.cls)), 4),
        medianTapReadyMs: round(median(runs.map(r => r.tapReadyMs))),
        uncompressedTextAssets: [...new Set(runs.flatMap(r => r.uncompressedAssets))],
      }
      pages[item.name] = figures
      medians[item.name] = { jsBytes: median(runs.map(r => r.jsBytes)), lcpMs: figures.medianLcpMs, cls: figures.worstCls }
      console.log(item.name.padEnd(11), JSON.stringify(figures))
    }

    const publicNames = cases.filter(c => c.public).map(c => c.name)
    const largestPublicJs = Math.max(...publicNames.map(n => medians[n]!.jsBytes))
    const largestPublicLcp = Math.max(...publicNames.map(n => medians[n]!.lcpMs))
    const figures = {
      ratios: {
        publicJsVsBudget: round(largestPublicJs / JS_BUDGET_BYTES, 2),
        publicLcpVsGood: round(largestPublicLcp / GOOD_LCP_MS, 2),
        sketchDeskLcpVsGood: round(medians.sketchDesk!.lcpMs / GOOD_LCP_MS, 2),
        worstClsVsGood: round(Math.max(...Object.values(medians).map(m => m.cls)) / GOOD_CLS, 2),
      },
      absolute: {
        largestPublicJsKB: round(largestPublicJs / 1024, 1),
        largestPublicLcpMs: largestPublicLcp,
        sketchDeskLcpMs: medians.sketchDesk!.lcpMs,
        worstCls: Math.max(...Object.values(medians).map(m => m.cls)),
      },
      pages,
    }

    const previous = existsSync(OUT) ? JSON.parse(readFileSync(OUT, 'utf8')) as { before?: unknown } : {}
    const result = {
      generatedAt: new Date().toISOString(),
      machine: { cpu: cpus()[0]?.model ?? 'unknown', cores: cpus().length, node: process.version, os: `${platform()} ${release()}`, chromium: browser.version() },
      conditions: {
        viewport: '390×844 at device pixel ratio 3, touch',
        cpuSlowdown: CPU_SLOWDOWN,
        network: '150 ms latency, 1.6 Mbit/s down, 750 kbit/s up (DevTools protocol emulation)',
        runsPerPage: RUNS,
        cache: 'empty (a new browser context each run)',
        goals: { publicJsVsBudget: '≤ 1 (150 KB)', publicLcpVsGood: '≤ 1 (2.5 s)', sketchDeskLcpVsGood: '≤ 1.2', worstClsVsGood: '≤ 1 (0.1)' },
      },
      ...figures,
      before: baseline ? { generatedAt: new Date().toISOString(), ...figures } : previous.before ?? null,
    }
    mkdirSync(resolve(ROOT, 'bench/results'), { recursive: true })
    writeFileSync(OUT, `${JSON.stringify(result, null, 2)}\n`)
    console.log(JSON.stringify(figures.ratios), JSON.stringify(figures.absolute))
    console.log(`wrote ${OUT}`)
  }
  finally {
    await browser.close()
    await app.stop()
  }
}

main().catch((error) => {
  console.error(error)
  process.exit(1)
})
