// Prints "N passed, N failed" from Vitest's JSON report. If the report is missing (the
// typecheck failed before Vitest ran), the failed step counts as one failure.
import { readFileSync } from 'node:fs';
const [file, status] = process.argv.slice(2);
let passed = 0;
let failed = 0;
try {
  const report = JSON.parse(readFileSync(file, 'utf8'));
  passed = report.numPassedTests;
  failed = report.numFailedTests + (report.numFailedTestSuites ?? 0);
} catch {
  failed = 1;
}
if (failed === 0 && status !== '0') failed = 1;
console.log(`${passed} passed, ${failed} failed`);
