// Prints vitest's totals from its JSON report as one line: "N passed, N failed".
import { existsSync, readFileSync } from 'node:fs'

const file = process.argv[2] ?? '.data/test-results.json'
if (!existsSync(file)) {
  console.log('0 passed, 1 failed')
  console.error(`No test report at ${file}: the run stopped before the tests (typecheck, lint or build failed).`)
  process.exit(1)
}
const report = JSON.parse(readFileSync(file, 'utf8'))
const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0)
console.log(`${report.numPassedTests} passed, ${report.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ''}`)
process.exit(report.numFailedTests > 0 || report.numTotalTests === 0 ? 1 : 0)
