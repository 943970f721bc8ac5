// Prints the closing line of Gatewell's test command: passed and failed tests over Vitest and Playwright.
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
const missing = [!vitest && 'vitest', !playwright && 'playwright'].filter(Boolean);
if (missing.length) console.log(`no results from: ${missing.join(', ')}`);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
