#!/usr/bin/env node
// Runs the whole test suite with vitest and ends with the line CI reads:
// "N passed, N failed, N skipped". Exits with vitest's status.
// Extra arguments go to vitest (e.g. `npm test -- src/wiring`).
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';

// The listening page's script bundle (dist/page.js) must match the sources the tests run.
const bundle = spawnSync(process.execPath, ['scripts/build-page.mjs'], { stdio: 'inherit' });
if (bundle.status !== 0) {
  console.log('0 passed, 1 failed, 0 skipped');
  process.exit(1);
}

const outputDir = 'test-output';
mkdirSync(outputDir, { recursive: true });
const report = join(outputDir, 'vitest-report.json');
rmSync(report, { force: true });

const result = spawnSync(
  process.execPath,
  ['node_modules/vitest/vitest.mjs', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...process.argv.slice(2)],
  { stdio: 'inherit', env: { ...process.env, NO_COLOR: '1', FORCE_COLOR: '0' } },
);

let passed = 0;
let failed = 0;
let skipped = 0;
try {
  const summary = JSON.parse(readFileSync(report, 'utf8'));
  passed = summary.numPassedTests ?? 0;
  failed = (summary.numFailedTests ?? 0) + countFilesFailedWithoutTests(summary);
  skipped = (summary.numPendingTests ?? 0) + (summary.numTodoTests ?? 0);
} catch {
  failed = Math.max(failed, 1); // no report: vitest could not run
}
const status = result.status ?? 1;
if (status !== 0 && failed === 0) failed = 1; // a failure vitest did not count as a test (collection error)
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(status === 0 && failed === 0 ? 0 : 1);

/** Test files that failed with no failing test in them (an error while loading or in a hook): one failure each. */
function countFilesFailedWithoutTests(summary) {
  return (summary.testResults ?? []).filter(
    (file) => file.status === 'failed' && !(file.assertionResults ?? []).some((test) => test.status === 'failed'),
  ).length;
}
