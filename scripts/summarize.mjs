// Sums the JSON reports of vitest and Playwright into the one closing line: "N passed, N failed".
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

const dir = process.argv[2] ?? '.tmp/reports';
let passed = 0;
let failed = 0;
for (const file of readdirSync(dir).filter((f) => f.endsWith('.json'))) {
  const report = JSON.parse(readFileSync(path.join(dir, file), 'utf8'));
  if (report.stats) {
    // Playwright: expected = passed, unexpected = failed, flaky passed on retry
    passed += (report.stats.expected ?? 0) + (report.stats.flaky ?? 0);
    failed += report.stats.unexpected ?? 0;
  } else {
    passed += report.numPassedTests ?? 0;
    failed += (report.numFailedTests ?? 0) + (report.numRuntimeErrorTestSuites ?? 0) + (report.numFailedTestSuites && !report.numFailedTests ? report.numFailedTestSuites : 0);
  }
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
