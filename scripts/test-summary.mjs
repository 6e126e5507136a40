// Adds up the unit (Vitest JSON) and browser (Playwright JSON) reports into
// one closing line: "N passed, N failed" (", N skipped" when any were).
import { existsSync, readFileSync } from 'node:fs';

let passed = 0;
let failed = 0;
let skipped = 0;
const [unitFile, e2eFile] = process.argv.slice(2);
if (unitFile && existsSync(unitFile)) {
  const u = JSON.parse(readFileSync(unitFile, 'utf8'));
  passed += u.numPassedTests ?? 0;
  failed += u.numFailedTests ?? 0;
  skipped += (u.numPendingTests ?? 0) + (u.numTodoTests ?? 0);
  // a suite that failed to load counts as a failure too
  if (!u.success && !u.numFailedTests) failed += Math.max(1, u.numFailedTestSuites ?? 0);
} else if (unitFile) {
  failed += 1;
}
if (e2eFile && existsSync(e2eFile)) {
  const e = JSON.parse(readFileSync(e2eFile, 'utf8'));
  passed += e.stats?.expected ?? 0;
  failed += (e.stats?.unexpected ?? 0) + (e.stats?.flaky ?? 0);
  skipped += e.stats?.skipped ?? 0;
}
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
