#!/usr/bin/env node
// Reads vitest's JSON report and prints the closing line `N passed, N failed[, N skipped]`,
// counting tests (not files). A test file that crashed before or around its tests (an import
// error, a failing beforeAll) has no failed test of its own, so it counts as one failure.
// Usage: summarize-vitest.mjs REPORT.json VITEST_EXIT_STATUS
// Exit status: 0 only when at least one test passed, none failed and vitest itself exited 0.
import { readFileSync } from 'node:fs';
import { relative } from 'node:path';

const [reportPath, vitestExitArg = '0'] = process.argv.slice(2);
const vitestExit = Number(vitestExitArg);

let report;
try {
  report = JSON.parse(readFileSync(reportPath, 'utf8'));
} catch (error) {
  console.log(`vitest left no readable report at ${reportPath} (${error.message}); vitest exit status ${vitestExit}`);
  console.log('0 passed, 0 failed');
  process.exit(1);
}

let passed = 0;
let failed = 0;
let skipped = 0;
for (const file of report.testResults ?? []) {
  let failedInFile = 0;
  for (const test of file.assertionResults ?? []) {
    if (test.status === 'passed') passed += 1;
    else if (test.status === 'failed') failedInFile += 1;
    else skipped += 1; // skipped, pending, todo
  }
  if (file.status === 'failed' && failedInFile === 0) {
    failedInFile = 1;
    const firstLine = String(file.message ?? 'no message').split('\n')[0];
    console.log(`test file failed to run: ${relative(process.cwd(), file.name ?? '?')}: ${firstLine}`);
  }
  failed += failedInFile;
}

if (vitestExit !== 0 && failed === 0) {
  console.log(`vitest exited with status ${vitestExit} although no test failed (an unhandled error or a config problem: see its output above)`);
}
if (passed + failed === 0) console.log('no test ran');

console.log(`${passed} passed, ${failed} failed${skipped > 0 ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 || passed === 0 || vitestExit !== 0 ? 1 : 0);
