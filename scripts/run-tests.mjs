// The test runs of `npm test`: every vitest project on the embedded SQLite, then the server project a second
// time against a private PostgreSQL cluster, so both dialects the README promises stay true. Each run writes
// its own JSON report; scripts/test-totals.mjs adds them up.
import { spawnSync } from 'node:child_process'
import { rmSync } from 'node:fs'
import { startPostgresCluster } from './postgres-cluster.mjs'

const vitest = ['node_modules/vitest/vitest.mjs', 'run']
const reports = { sqlite: '.data/test-results.json', postgres: '.data/test-results-postgres.json' }
for (const file of Object.values(reports)) rmSync(file, { force: true })

function run(label, args, env) {
  const started = Date.now()
  const result = spawnSync(process.execPath, [...vitest, ...args], { stdio: 'inherit', env: { ...process.env, ...env } })
  const seconds = ((Date.now() - started) / 1000).toFixed(1)
  console.log(`[tests] ${label}: ${result.status === 0 ? 'passed' : 'FAILED'} in ${seconds} s`)
  return result.status === 0
}

let ok = run('all projects on SQLite', [], { TEST_REPORT: reports.sqlite })

let cluster
try {
  cluster = await startPostgresCluster()
}
catch (error) {
  console.error(`[tests] could not start PostgreSQL: ${error.message}`)
  process.exit(1)
}
try {
  ok = run('server project on PostgreSQL', ['--project', 'server'], { TEST_REPORT: reports.postgres, TEST_POSTGRES_URL: cluster.url }) && ok
}
finally {
  cluster.stop()
}
process.exit(ok ? 0 : 1)
