import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

// Three projects: fast unit tests of the computation and schemas, server tests
// against the built app over HTTP, and browser tests driving Debian's chromium.
// `npm test` builds the app before vitest runs, so the server and browser
// projects can start `.output/server/index.mjs` directly.
export default defineConfig({
  resolve: {
    // The same alias Nuxt gives code shared by the app and the server.
    alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) },
  },
  test: {
    // The JSON report gives .ci/run its closing line of totals; scripts/run-tests.mjs names one a run.
    reporters: ['default', ['json', { outputFile: process.env.TEST_REPORT || '.data/test-results.json' }]],
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          environment: 'node',
          include: ['tests/unit/**/*.test.ts'],
        },
      },
      {
        extends: true,
        // On PostgreSQL (TEST_POSTGRES_URL, set by scripts/run-tests.mjs) a test that opens its app's
        // SQLite file with better-sqlite3 gets the app's PostgreSQL database instead.
        resolve: process.env.TEST_POSTGRES_URL
          ? { alias: { 'better-sqlite3': fileURLToPath(new URL('./tests/support/sqliteOnPostgres.ts', import.meta.url)) } }
          : undefined,
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
})
