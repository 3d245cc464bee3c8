// Shared by the HTTP benchmarks: a synthetic database, the built server on it, and autocannon runs that
// keep every response time so the median and 95th percentile are exact.

import { spawn } from 'node:child_process'
import { existsSync, mkdtempSync } from 'node:fs'
import { cpus, platform, release, tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import autocannon from 'autocannon'

export const root = resolve(import.meta.dirname, '../..')

export function freshDataDir(name: string): string {
  return mkdtempSync(join(tmpdir(), `shadowline-bench-${name}-`))
}

export async function startServer(dataDir: string, port: number, env: Record<string, string> = {}): Promise<{ url: string, stop: () => void }> {
  const entry = join(root, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('Build the app first: npm run build')
  const child = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      NUXT_DATA_DIR: dataDir,
      NUXT_SEED_DEMO: 'false',
      NUXT_SESSION_PASSWORD: 'bench-session-password-that-is-long-enough-000000',
      NUXT_S3_EMBEDDED_PORT: '0',
      NUXT_SMTP_EMBEDDED_PORT: '0',
      ...env,
    },
    stdio: 'ignore',
  })
  const url = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 60_000
  while (!(await fetch(`${url}/api/health`).then(r => r.ok).catch(() => false))) {
    if (Date.now() > deadline || child.exitCode !== null) throw new Error('server did not start')
    await new Promise(r => setTimeout(r, 200))
  }
  return { url, stop: () => child.kill('SIGTERM') }
}

export interface Timing {
  requests: number
  errors: number
  non2xx: number
  medianMs: number
  p95Ms: number
  meanMs: number
  requestsPerSecond: number
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return Number.NaN
  const rank = (sorted.length - 1) * p
  const lo = Math.floor(rank)
  const hi = Math.ceil(rank)
  return sorted[lo]! + (sorted[hi]! - sorted[lo]!) * (rank - lo)
}

/** The figures of several measurements taken together: every response time, and their combined rate. */
export function summarize(times: number[], parts: Timing[]): Timing {
  const sorted = [...times].sort((a, b) => a - b)
  const seconds = parts.reduce((s, p) => s + p.requests / p.requestsPerSecond, 0)
  return {
    requests: sorted.length,
    errors: parts.reduce((s, p) => s + p.errors, 0),
    non2xx: parts.reduce((s, p) => s + p.non2xx, 0),
    medianMs: percentile(sorted, 0.5),
    p95Ms: percentile(sorted, 0.95),
    meanMs: sorted.reduce((s, t) => s + t, 0) / sorted.length,
    requestsPerSecond: sorted.length / seconds,
  }
}

/**
 * Runs `amount` requests over `connections` connections, paths drawn in turn from `paths`; `keep`, when
 * given, collects the response times too; `headers` go with every request (a session cookie).
 */
export async function measure(url: string, paths: string[], connections: number, amount: number, keep?: number[][], headers: Record<string, string> = {}): Promise<Timing> {
  const times: number[] = []
  let next = 0
  const started = Date.now()
  let finished: (result: autocannon.Result) => void = () => undefined
  let failed: (error: Error) => void = () => undefined
  const done = new Promise<autocannon.Result>((resolve, reject) => {
    finished = resolve
    failed = reject
  })
  const instance = autocannon({
    url,
    connections,
    amount,
    headers,
    requests: [{ setupRequest: request => ({ ...request, path: paths[next++ % paths.length]! }) }],
  }, (error, result) => (error ? failed(error) : finished(result)))
  instance.on('response', (_client, _status, _bytes, responseTime) => {
    times.push(responseTime)
  })
  const result = await done
  const elapsed = (Date.now() - started) / 1000
  times.sort((a, b) => a - b)
  keep?.push(times)
  return {
    requests: times.length,
    errors: result.errors,
    non2xx: result.non2xx,
    medianMs: percentile(times, 0.5),
    p95Ms: percentile(times, 0.95),
    meanMs: times.reduce((s, t) => s + t, 0) / times.length,
    requestsPerSecond: times.length / elapsed,
  }
}

export function machine() {
  return { cpu: cpus()[0]?.model ?? 'unknown', cores: cpus().length, node: process.version, os: `${platform()} ${release()}` }
}

/** A small deterministic generator for the synthetic data. */
export function random(seed: number): () => number {
  let state = seed
  return () => {
    state = (state + 0x6D2B79F5) | 0
    let t = Math.imul(state ^ (state >>> 15), 1 | state)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** Invented feature-like names from syllables, e.g. "Varnel Ridge". */
export function inventedName(rand: () => number, i: number): string {
  const syllables = ['var', 'nel', 'tor', 'mi', 'sa', 'quen', 'do', 'bra', 'lis', 'ko', 'ter', 'un', 'ves', 'pa', 'rho', 'zel']
  const kinds = ['crater', 'ridge', 'rille', 'bay', 'peak', 'dome', 'wall', 'plain']
  const word = Array.from({ length: 2 + Math.floor(rand() * 2) }, () => syllables[Math.floor(rand() * syllables.length)]).join('')
  return `${word[0]!.toUpperCase()}${word.slice(1)} ${kinds[i % kinds.length]} ${i}`
}
