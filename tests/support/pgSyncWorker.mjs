// Runs the queries of tests/support/sqliteOnPostgres.ts on PostgreSQL. The caller blocks on a shared flag
// while this worker answers, which gives the test files better-sqlite3's synchronous calls.
import { parentPort, workerData } from 'node:worker_threads'
import pg from 'pg'

pg.types.setTypeParser(20, Number)
const client = new pg.Client({ connectionString: workerData.url })
const connected = client.connect()

parentPort.on('message', async ({ sql, params, shared, port }) => {
  const flag = new Int32Array(shared)
  try {
    await connected
    const result = await client.query(sql, params)
    port.postMessage({ rows: result.rows ?? [], changes: result.rowCount ?? 0 })
  }
  catch (error) {
    port.postMessage({ error: error.message })
  }
  Atomics.store(flag, 0, 1)
  Atomics.notify(flag, 0)
})
