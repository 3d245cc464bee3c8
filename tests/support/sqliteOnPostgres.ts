// Stands in for better-sqlite3 when the server tests run on PostgreSQL (vitest.config.ts aliases it), so a
// test that reaches into its test app's database with `new Database(join(app.dataDir, 'shadowline.sqlite'))`
// runs unchanged on both dialects: the file name is mapped to the app's PostgreSQL database (written by
// startApp), `?` placeholders become `$n`, and each call waits for its answer like better-sqlite3's do.
import { existsSync, readFileSync } from 'node:fs'
import { basename, dirname, join } from 'node:path'
import { MessageChannel, receiveMessageOnPort, Worker } from 'node:worker_threads'

const workerFile = join(import.meta.dirname, 'pgSyncWorker.mjs')

interface Answer {
  rows: Record<string, unknown>[]
  changes: number
  error?: string
}

/** `?` to `$1…`, leaving quoted text alone. */
function numbered(sql: string): string {
  let n = 0
  return sql.replace(/'(?:[^']|'')*'|"(?:[^"]|"")*"|\?/g, m => (m === '?' ? `$${++n}` : m))
}

function bound(args: unknown[]): unknown[] {
  const values = args.length === 1 && Array.isArray(args[0]) ? args[0] as unknown[] : args
  return values.map(v => (typeof v === 'bigint' ? Number(v) : v))
}

class Statement {
  readonly reader: boolean
  constructor(private readonly db: Database, private readonly sql: string) {
    this.reader = /^\s*(select|with|values)\b/i.test(sql) || /\breturning\b/i.test(sql)
  }

  all(...args: unknown[]) {
    return this.db.query(this.sql, bound(args)).rows
  }

  get(...args: unknown[]) {
    return this.db.query(this.sql, bound(args)).rows[0]
  }

  run(...args: unknown[]) {
    return { changes: this.db.query(this.sql, bound(args)).changes, lastInsertRowid: 0 }
  }

  * iterate(...args: unknown[]) {
    yield* this.all(...args)
  }
}

export default class Database {
  private readonly worker: Worker
  readonly open = true

  constructor(file: string) {
    const urlFile = join(dirname(file), 'database-url')
    if (basename(file) !== 'shadowline.sqlite' || !existsSync(urlFile)) {
      throw new Error(`On PostgreSQL only a test app's database can be opened this way, not ${file}.`)
    }
    this.worker = new Worker(workerFile, { workerData: { url: readFileSync(urlFile, 'utf8').trim() } })
    this.worker.unref()
  }

  query(sql: string, params: unknown[]): Answer {
    const shared = new SharedArrayBuffer(4)
    const { port1, port2 } = new MessageChannel()
    this.worker.postMessage({ sql: numbered(sql), params, shared, port: port2 }, [port2])
    Atomics.wait(new Int32Array(shared), 0, 0, 30_000)
    const answer = receiveMessageOnPort(port1)?.message as Answer | undefined
    port1.close()
    if (!answer) throw new Error(`No answer from PostgreSQL to: ${sql}`)
    if (answer.error) throw new Error(`${answer.error}\n  in: ${sql}`)
    return answer
  }

  prepare(sql: string) {
    return new Statement(this, sql)
  }

  exec(sql: string) {
    this.query(sql, [])
    return this
  }

  /** SQLite's settings mean nothing here. */
  pragma() {
    return undefined
  }

  close() {
    void this.worker.terminate()
  }
}
