// Prints the closing line of Gatewell's test command: passed and failed tests over Vitest and Playwright.
// Arguments: the names of the steps that failed (scripts/test.sh). A failed step that no failing test
// accounts for (lint, type check, build, a server that did not start) counts as one failure, so that
// the line never reads "0 failed" for a red run.
import { existsSync, readFileSync } from 'node:fs';

function read(file) {
  return existsSync(file) ? JSON.parse(readFileSync(file, 'utf8')) : null;
}

let passed = 0;
let failed = 0;
let skipped = 0;

const vitest = read('test-output/vitest.json');
if (vitest) {
  passed += vitest.numPassedTests;
  failed += vitest.numFailedTests;
  skipped += vitest.numPendingTests + vitest.numTodoTests;
}
const playwright = read('test-output/playwright.json');
if (playwright) {
  passed += playwright.stats.expected;
  failed += playwright.stats.unexpected + playwright.stats.flaky;
  skipped += playwright.stats.skipped;
}
// The failing tests are named again here, at the end, so a log that only keeps its tail still says which.
const failures = [];
for (const file of vitest?.testResults ?? []) {
  for (const test of file.assertionResults ?? []) {
    if (test.status !== 'failed') continue;
    const why = String(test.failureMessages?.[0] ?? '')
      .split('\n')[0]
      .slice(0, 300);
    failures.push(`vitest: ${file.name.replace(process.cwd() + '/', '')} › ${test.fullName}\n    ${why}`);
  }
}
function walkSuites(suites, titles) {
  for (const suite of suites ?? []) {
    const path = suite.title ? [...titles, suite.title] : titles;
    for (const spec of suite.specs ?? []) {
      for (const test of spec.tests ?? []) {
        if (test.status !== 'unexpected' && test.status !== 'flaky') continue;
        const error = test.results?.find((r) => r.error)?.error?.message ?? '';
        const why = String(error).split('\n')[0].slice(0, 300);
        failures.push(`playwright (${test.status}): ${[...path, spec.title].join(' › ')}\n    ${why}`);
      }
    }
    walkSuites(suite.suites, path);
  }
}
walkSuites(playwright?.suites, []);
if (failures.length) console.log(`failing tests:\n  ${failures.join('\n  ')}`);

const vitestFailed = vitest ? vitest.numFailedTests : 0;
const playwrightFailed = playwright ? playwright.stats.unexpected + playwright.stats.flaky : 0;
const unaccounted = process.argv.slice(2).filter((step) => {
  if (step.includes('(vitest)') && vitestFailed > 0) return false;
  if (step.includes('(playwright)') && playwrightFailed > 0) return false;
  return true;
});
failed += unaccounted.length;
if (unaccounted.length)
  console.log(`counted as one failure each, with no failing test of their own: ${unaccounted.join('; ')}`);
const missing = [!vitest && 'vitest', !playwright && 'playwright'].filter(Boolean);
if (missing.length) console.log(`no results from: ${missing.join(', ')}`);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
