// The public atlas under load on a synthetic atlas: a phase filter (on pages reached by following the page
// links, so deep keyset pages are in the mix), a colongitude range and a feature filter, through HTTP with
// 20 concurrent clients, each against the trivial JSON route (/api/health) of the same server measured
// just before it. The server is the built app in its own process; the load comes from this one.
// A script, not a test: it prints the figures and writes them to bench/results/atlas.json.
//
//   npm run bench:atlas                 100k published entries on SQLite (cold and warm, 3 runs)
//   npm run bench:atlas -- --1m         … and 1M entries on SQLite
//   npm run bench:atlas -- --pg         … and 100k on PostgreSQL (a private cluster, as in CI)
//   npm run bench:atlas -- --pg-1m      … and 1M on PostgreSQL
//   npm run bench:atlas -- --all        every one of them (about 25 minutes on a busy 2-core machine)
//   --skip-100k                         only the larger or PostgreSQL runs asked for
//   --runs N                            repetitions of each cold measurement (default 3; warm: one)
//   --amount N                          requests per route and measurement (default 2400, in 6 bursts)
//
// Cold: the server's page cache is off (NUXT_ATLAS_CACHE_ENTRIES=0), so every request reads the database;
// the goals are about cold reads. Warm: the cache on, every page already built once (what repeat visitors
// get within the max-age). Neither sends If-None-Match, so no 304 is counted.

import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { getRandomPort } from 'get-port-please'
import { createDatabase } from '../db/connect'
import { migrateToLatest } from '../db/migrate'
import { PHASE_NAMES } from '../shared/observing/phases'
import { fillAtlas, sqliteForLoading } from './support/atlasData'
import { freshDataDir, machine, measure, random, root, startServer, summarize, type Timing } from './support/http'
import { startPostgresCluster, type PostgresCluster } from '../scripts/postgres-cluster.mjs'

const args = process.argv.slice(2)
const flag = (name: string) => args.includes(`--${name}`) || args.includes('--all')
const option = (name: string, fallback: number) => (args.includes(`--${name}`) ? Number(args[args.indexOf(`--${name}`) + 1]) || fallback : fallback)
const RUNS = option('runs', 3)
const CONNECTIONS = 20
const AMOUNT = option('amount', 2400)
const BURSTS = 6
const FEATURES = 5_000
const PINS_PER_ENTRY = 2

interface Scenario { key: string, label: string, dialect: 'sqlite' | 'postgres', entries: number }
const scenarios: Scenario[] = [
  ...(args.includes('--skip-100k') ? [] : [{ key: '', label: '100k entries, SQLite', dialect: 'sqlite' as const, entries: 100_000 }]),
  ...(flag('1m') ? [{ key: 'At1M', label: '1M entries, SQLite', dialect: 'sqlite' as const, entries: 1_000_000 }] : []),
  ...(flag('pg') ? [{ key: 'Pg', label: '100k entries, PostgreSQL', dialect: 'postgres' as const, entries: 100_000 }] : []),
  ...(flag('pg-1m') ? [{ key: 'PgAt1M', label: '1M entries, PostgreSQL', dialect: 'postgres' as const, entries: 1_000_000 }] : []),
]

const ROUTES = ['phase', 'colongitude', 'feature', 'featurePage'] as const
type Route = typeof ROUTES[number]
interface RouteRun { trivial: Timing, route: Timing, p95VsTrivial: number }

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

/** Phase pages as a reader reaches them: the first page of each phase, then following Next up to 20 deep. */
async function phasePaths(url: string): Promise<string[]> {
  const paths: string[] = []
  for (const phase of PHASE_NAMES) {
    let path = `/api/atlas?phase=${phase}`
    for (let depth = 0; depth < 20; depth += 1) {
      paths.push(path)
      const body = await (await fetch(url + path)).json() as { next: string | null }
      if (!body.next) break
      path = `/api/atlas?phase=${phase}&after=${encodeURIComponent(body.next)}`
    }
  }
  const rand = random(5)
  return paths.sort(() => rand() - 0.5)
}

function paths(featureIds: string[]): Record<Exclude<Route, 'phase'>, string[]> {
  const rand = random(11)
  return {
    colongitude: Array.from({ length: 200 }, () => {
      const lo = Math.floor(rand() * 350)
      return `/api/atlas?colongitudeMin=${lo}&colongitudeMax=${lo + 10}`
    }),
    feature: Array.from({ length: 200 }, () => `/api/atlas?feature=${featureIds[Math.floor(rand() * featureIds.length)]}`),
    featurePage: Array.from({ length: 200 }, () => `/api/features/${featureIds[Math.floor(rand() * featureIds.length)]}`),
  }
}

/**
 * The trivial route and the route measured in turns, a burst of each at a time, so that whatever else the
 * machine is doing falls on both alike; each burst runs alone against the server.
 */
async function alternate(url: string, routePaths: string[]): Promise<{ trivial: Timing, timing: Timing }> {
  const trivial: number[][] = []
  const timing: number[][] = []
  const bursts: [Timing, Timing][] = []
  for (let b = 0; b < BURSTS; b += 1) {
    const t = await measure(url, ['/api/health'], CONNECTIONS, AMOUNT / BURSTS, trivial)
    const r = await measure(url, routePaths, CONNECTIONS, AMOUNT / BURSTS, timing)
    bursts.push([t, r])
  }
  return { trivial: summarize(trivial.flat(), bursts.map(x => x[0])), timing: summarize(timing.flat(), bursts.map(x => x[1])) }
}

async function measureServer(url: string, routePaths: Record<Route, string[]>, runs: number, routes: readonly Route[]) {
  // Warm-up: the JIT, the database's page cache and (when on) the server's page cache.
  await measure(url, ['/api/health'], CONNECTIONS, 1000)
  for (const route of routes) await measure(url, routePaths[route], CONNECTIONS, routePaths[route].length * 2)
  const done: Partial<Record<Route, RouteRun>>[] = []
  for (let run = 0; run < runs; run += 1) {
    const one: Partial<Record<Route, RouteRun>> = {}
    for (const route of routes) {
      const { trivial, timing } = await alternate(url, routePaths[route])
      one[route] = { trivial, route: timing, p95VsTrivial: timing.p95Ms / trivial.p95Ms }
    }
    done.push(one)
    console.log(`    run ${run + 1}: ${routes.map(r => `${r} ${one[r]!.p95VsTrivial.toFixed(2)} (p95 ${one[r]!.route.p95Ms.toFixed(1)} / ${one[r]!.trivial.p95Ms.toFixed(1)} ms)`).join(', ')}`)
  }
  const ratios = Object.fromEntries(routes.map(r => [r, median(done.map(x => x[r]!.p95VsTrivial))])) as Record<Route, number>
  return { ratios, runs: done.map(x => Object.fromEntries(routes.map(r => [r, { ratio: x[r]!.p95VsTrivial, route: x[r]!.route, trivial: x[r]!.trivial }]))) }
}

async function runScenario(s: Scenario) {
  console.log(`${s.label}: building ${s.entries} published entries and ${s.entries * PINS_PER_ENTRY} pins…`)
  const dataDir = freshDataDir('atlas')
  let cluster: PostgresCluster | undefined
  try {
    cluster = s.dialect === 'postgres' ? await startPostgresCluster() : undefined
    const built = Date.now()
    const migrated = await createDatabase({ url: cluster?.url ?? '', dataDir })
    await migrateToLatest(migrated)
    if (s.dialect === 'sqlite') await migrated.destroy()
    const db = s.dialect === 'sqlite' ? sqliteForLoading(join(dataDir, 'shadowline.sqlite')) : migrated
    const featureIds = await fillAtlas(db, s.dialect, { entries: s.entries, features: FEATURES, pinsPerEntry: PINS_PER_ENTRY })
    await db.destroy()
    const buildSeconds = (Date.now() - built) / 1000
    console.log(`  built in ${buildSeconds.toFixed(0)} s`)
    const result: Record<string, unknown> = { buildSeconds }
    for (const mode of ['cold', 'warm'] as const) {
      const server = await startServer(dataDir, await getRandomPort('127.0.0.1'), {
        NUXT_ATLAS_CACHE_ENTRIES: mode === 'cold' ? '0' : '2000',
        ...(cluster ? { NUXT_DATABASE_URL: cluster.url } : {}),
      })
      try {
        console.log(`  ${mode} reads (server page cache ${mode === 'cold' ? 'off' : 'on'})`)
        const routePaths = { phase: await phasePaths(server.url), ...paths(featureIds) }
        // Warm reads once, to show what the cache gives; the goals are on the cold runs. The feature's own
        // page is not cached (it is measured cold, for the record).
        result[mode] = mode === 'cold'
          ? await measureServer(server.url, routePaths, RUNS, ROUTES)
          : await measureServer(server.url, routePaths, 1, ROUTES.filter(r => r !== 'featurePage'))
      }
      finally {
        server.stop()
      }
    }
    return result as { buildSeconds: number, cold: Awaited<ReturnType<typeof measureServer>>, warm: Awaited<ReturnType<typeof measureServer>> }
  }
  finally {
    cluster?.stop()
    rmSync(dataDir, { recursive: true, force: true })
  }
}

const file = join(root, 'bench/results/atlas.json')
const fresh: Record<string, unknown> = {}
const started = Date.now()
for (const s of scenarios) {
  const figures = await runScenario(s)
  fresh[s.key || '100k'] = {
    label: s.label,
    generatedAt: new Date().toISOString(),
    data: { publishedEntries: s.entries, features: FEATURES, pins: s.entries * PINS_PER_ENTRY },
    ...figures,
  }
}

// Scenarios not run this time keep their last figures (read now, so runs of other scenarios meanwhile stay).
const previous = existsSync(file) ? JSON.parse(readFileSync(file, 'utf8')) as { scenarios?: Record<string, unknown> } : {}
const done: Record<string, unknown> = { ...previous.scenarios, ...fresh }

// Each ratio: the median over runs of the route's p95 over the trivial route's p95 (cold reads).
const ratios: Record<string, number> = {}
for (const [key, scenario] of Object.entries(done) as [string, { cold: { ratios: Record<Route, number> } }][]) {
  const suffix = key === '100k' ? '' : key
  ratios[`phaseP95VsTrivial${suffix}`] = scenario.cold.ratios.phase
  ratios[`colongitudeP95VsTrivial${suffix}`] = scenario.cold.ratios.colongitude
  ratios[`featureP95VsTrivial${suffix}`] = scenario.cold.ratios.feature
  ratios[`featurePageP95VsTrivial${suffix}`] = scenario.cold.ratios.featurePage
}
const results = {
  generatedAt: new Date().toISOString(),
  machine: machine(),
  note: 'Shared 2-core machine: other work competes with both the server and the load; each ratio is against the trivial route measured just before it. Scenarios not run this time keep their earlier figures (see each generatedAt).',
  load: { connections: CONNECTIONS, requestsPerMeasurement: AMOUNT, runs: RUNS, tool: 'autocannon, in its own process' },
  ratios,
  goal: 'each ratio ≤ 3 (cold reads)',
  scenarios: done,
}
mkdirSync(join(root, 'bench/results'), { recursive: true })
writeFileSync(file, `${JSON.stringify(results, null, 2)}\n`)
for (const [key, scenario] of Object.entries(done) as [string, { cold: { ratios: object }, warm: { ratios: object } }][]) {
  console.log(key, 'cold', scenario.cold.ratios, 'warm', scenario.warm.ratios)
}
console.log(ratios)
console.log(`in ${((Date.now() - started) / 60_000).toFixed(1)} min`)
