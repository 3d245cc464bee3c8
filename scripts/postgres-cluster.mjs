// A private, throw-away PostgreSQL cluster for the server tests, the atlas query-plan test and benchmark: initdb in a temporary folder, a free port on
// 127.0.0.1, trust authentication, no durability (it is deleted afterwards). PostgreSQL refuses to run as
// root, so as root the cluster belongs to the `postgres` account that Debian's package creates.
import { execFileSync } from 'node:child_process'
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { getRandomPort } from 'get-port-please'

/** The newest installed server's bin folder (Debian keeps each major version apart), or null. */
export function postgresBinDir() {
  const base = '/usr/lib/postgresql'
  if (!existsSync(base)) return null
  const versions = readdirSync(base).filter(v => existsSync(join(base, v, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a))
  return versions.length ? join(base, versions[0], 'bin') : null
}

function asOwner(owner, command, args) {
  if (!owner) return execFileSync(command, args, { stdio: ['ignore', 'pipe', 'pipe'] })
  return execFileSync('runuser', ['-u', owner, '--', command, ...args], { stdio: ['ignore', 'pipe', 'pipe'] })
}

/** Starts a cluster and returns its URL (the `postgres` maintenance database) and a stop function. */
export async function startPostgresCluster() {
  const bin = postgresBinDir()
  if (!bin) throw new Error('PostgreSQL is not installed: apt-get install -y postgresql (.ci/run does this).')
  const owner = process.getuid?.() === 0 ? 'postgres' : null
  const dir = mkdtempSync(join(tmpdir(), 'shadowline-pg-'))
  if (owner) {
    const uid = Number(execFileSync('id', ['-u', owner]).toString().trim())
    const gid = Number(execFileSync('id', ['-g', owner]).toString().trim())
    chownSync(dir, uid, gid)
  }
  const data = join(dir, 'data')
  const port = await getRandomPort('127.0.0.1')
  asOwner(owner, join(bin, 'initdb'), ['-D', data, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8', '--no-sync'])
  const options = [
    `-p ${port}`, `-k ${dir}`, '-c listen_addresses=127.0.0.1',
    // Thrown away afterwards, so it need not survive a crash; this only speeds up loading test and benchmark
    // data. Otherwise PostgreSQL's default memory settings, as a small deployment would run it.
    '-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off', '-c max_connections=200', '-c max_wal_size=4GB',
  ].join(' ')
  asOwner(owner, join(bin, 'pg_ctl'), ['-D', data, '-o', options, '-l', join(dir, 'log'), '-w', '-t', '60', 'start'])
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    stop() {
      try {
        asOwner(owner, join(bin, 'pg_ctl'), ['-D', data, '-m', 'immediate', '-w', 'stop'])
      }
      finally {
        rmSync(dir, { recursive: true, force: true })
      }
    },
  }
}
