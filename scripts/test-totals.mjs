// Prints vitest's totals from its JSON reports (the SQLite run and the PostgreSQL run of the server tests)
// as one line: "N passed, N failed".
import { existsSync, readFileSync } from 'node:fs'

const files = process.argv.length > 2 ? process.argv.slice(2) : ['.data/test-results.json', '.data/test-results-postgres.json']
const totals = { passed: 0, failed: 0, skipped: 0, total: 0 }
let missing = 0
for (const file of files) {
  if (!existsSync(file)) {
    missing += 1
    console.error(`No test report at ${file}: that run stopped before its tests (typecheck, lint, build or the database failed).`)
    continue
  }
  const report = JSON.parse(readFileSync(file, 'utf8'))
  totals.passed += report.numPassedTests
  totals.failed += report.numFailedTests
  totals.skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0)
  totals.total += report.numTotalTests
}
const failed = totals.failed + missing
console.log(`${totals.passed} passed, ${failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}`)
process.exit(failed > 0 || totals.total === 0 ? 1 : 0)
