// The public atlas under load (synthetic data): a phase filter, a colongitude range and a feature, through
// HTTP with 20 concurrent clients, against a trivial JSON route on the same server. A script, not a test.
//   npm run bench:atlas   → prints the figures and writes bench/results/atlas.json

import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { PHASE_NAMES } from '../shared/observing/phases'
import { buildSyntheticDb } from './support/synthetic'
import { freshDataDir, machine, measure, random, root, startServer } from './support/http'

const ENTRIES = 100_000
const FEATURES = 5_000
const PINS_PER_SKETCH = 2
const CONNECTIONS = 20
const AMOUNT = 4000

const dataDir = freshDataDir('atlas')
console.log(`Building ${ENTRIES} published entries…`)
const built = Date.now()
const { featureIds } = await buildSyntheticDb(dataDir, { sketches: ENTRIES, publishedShare: 1, features: FEATURES, pinsPerSketch: PINS_PER_SKETCH })
console.log(`  in ${((Date.now() - built) / 1000).toFixed(1)} s`)

const server = await startServer(dataDir, 3951)
try {
  const rand = random(11)
  const phase = Array.from({ length: 200 }, (_, i) => `/api/atlas?phase=${PHASE_NAMES[i % PHASE_NAMES.length]}&page=${1 + Math.floor(rand() * 5)}`)
  const colongitude = Array.from({ length: 200 }, () => {
    const lo = Math.floor(rand() * 350)
    return `/api/atlas?colongitudeMin=${lo}&colongitudeMax=${lo + 10}`
  })
  const feature = Array.from({ length: 200 }, () => `/api/atlas?feature=${featureIds[Math.floor(rand() * featureIds.length)]}`)
  await measure(server.url, ['/api/health'], CONNECTIONS, 1000)
  await measure(server.url, [...phase, ...colongitude, ...feature], CONNECTIONS, 1000)
  const trivial = await measure(server.url, ['/api/health'], CONNECTIONS, AMOUNT)
  const byPhase = await measure(server.url, phase, CONNECTIONS, AMOUNT)
  const byColongitude = await measure(server.url, colongitude, CONNECTIONS, AMOUNT)
  const byFeature = await measure(server.url, feature, CONNECTIONS, AMOUNT)
  const results = {
    generatedAt: new Date().toISOString(),
    machine: machine(),
    data: { publishedEntries: ENTRIES, features: FEATURES, pins: ENTRIES * PINS_PER_SKETCH },
    load: { connections: CONNECTIONS, requestsPerRoute: AMOUNT, tool: 'autocannon' },
    routes: { trivial, phase: byPhase, colongitude: byColongitude, feature: byFeature },
    ratios: {
      phaseP95VsTrivial: byPhase.p95Ms / trivial.p95Ms,
      colongitudeP95VsTrivial: byColongitude.p95Ms / trivial.p95Ms,
      featureP95VsTrivial: byFeature.p95Ms / trivial.p95Ms,
    },
    goal: 'each ratio ≤ 3',
  }
  mkdirSync(join(root, 'bench/results'), { recursive: true })
  writeFileSync(join(root, 'bench/results/atlas.json'), `${JSON.stringify(results, null, 2)}\n`)
  console.table({ trivial, phase: byPhase, colongitude: byColongitude, feature: byFeature })
  console.log(results.ratios)
}
finally {
  server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
