// Features under load (synthetic data): name search (with the reference formations' standard names beside
// the users' own) and the feature page through HTTP, against a trivial JSON route on the same server. The
// routes are measured side by side, in alternating rounds, so that a busy machine weighs on each alike.
// A script, not a test.
//   npm run bench:features   → prints the figures and writes bench/results/features.json

import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { loadavg } from 'node:os'
import { join } from 'node:path'
import { buildSyntheticDb } from './support/synthetic'
import { summarize, freshDataDir, machine, measure, random, root, startServer, type Timing } from './support/http'

const FEATURES = 20_000
const SKETCHES = 20_000
const PINS_PER_SKETCH = 10
const CONNECTIONS = 10
const AMOUNT = 3000
const ROUNDS = 6

const dataDir = freshDataDir('features')
console.log(`Building ${FEATURES} features and ${SKETCHES * PINS_PER_SKETCH} pins…`)
const built = Date.now()
const { featureIds, featureNames } = await buildSyntheticDb(dataDir, { sketches: SKETCHES, publishedShare: 0.5, features: FEATURES, pinsPerSketch: PINS_PER_SKETCH })
console.log(`  in ${((Date.now() - built) / 1000).toFixed(1)} s`)

const server = await startServer(dataDir, 3950)
try {
  const rand = random(7)
  // Queries as people type them: a prefix of a name, lower case, sometimes with a slip.
  const queries = Array.from({ length: 500 }, () => {
    const name = featureNames[Math.floor(rand() * featureNames.length)]!.toLowerCase()
    const typed = name.slice(0, 4 + Math.floor(rand() * 6))
    return `/api/features?q=${encodeURIComponent(rand() < 0.2 ? typed.replace(/[aeiou]/, 'e') : typed)}`
  })
  const pages = Array.from({ length: 500 }, () => `/api/features/${featureIds[Math.floor(rand() * featureIds.length)]}`)
  // Warm up the server and SQLite's page cache.
  await measure(server.url, ['/api/health'], CONNECTIONS, 500)
  await measure(server.url, queries, CONNECTIONS, 500)
  const rounds: Record<'trivial' | 'search' | 'page', Timing[]> = { trivial: [], search: [], page: [] }
  const times: Record<'trivial' | 'search' | 'page', number[][]> = { trivial: [], search: [], page: [] }
  for (let round = 0; round < ROUNDS; round += 1) {
    rounds.trivial.push(await measure(server.url, ['/api/health'], CONNECTIONS, AMOUNT / ROUNDS, times.trivial))
    rounds.search.push(await measure(server.url, queries, CONNECTIONS, AMOUNT / ROUNDS, times.search))
    rounds.page.push(await measure(server.url, pages, CONNECTIONS, AMOUNT / ROUNDS, times.page))
  }
  const trivial = summarize(times.trivial.flat(), rounds.trivial)
  const search = summarize(times.search.flat(), rounds.search)
  const page = summarize(times.page.flat(), rounds.page)
  const results = {
    generatedAt: new Date().toISOString(),
    machine: machine(),
    data: { features: FEATURES, pins: SKETCHES * PINS_PER_SKETCH, sketches: SKETCHES },
    load: { connections: CONNECTIONS, requestsPerRoute: AMOUNT, rounds: ROUNDS, tool: 'autocannon' },
    loadAverage: loadavg(),
    note: 'Measured on a shared machine (other builds and tests running at the same time): compare the ratios, not the milliseconds.',
    routes: { trivial, search, featurePage: page },
    ratios: {
      searchP95VsTrivial: search.p95Ms / trivial.p95Ms,
      searchMedianVsTrivial: search.medianMs / trivial.medianMs,
      pageP95VsTrivial: page.p95Ms / trivial.p95Ms,
      pageMedianVsTrivial: page.medianMs / trivial.medianMs,
    },
    goal: 'searchP95VsTrivial ≤ 3',
    met: search.p95Ms / trivial.p95Ms <= 3,
  }
  mkdirSync(join(root, 'bench/results'), { recursive: true })
  writeFileSync(join(root, 'bench/results/features.json'), `${JSON.stringify(results, null, 2)}\n`)
  console.table({ trivial, search, featurePage: page })
  console.log(results.ratios)
}
finally {
  server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
