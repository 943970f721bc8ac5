// Gatewell bad-input benchmark: how long the parse of each hostile upload takes before it is refused, and
// how much the main process's heap grows across it. Prints figures; checks nothing (the refusals themselves
// are checked in tests/integration/plate-import-bad-input-corpus.test.ts). Needs no database:
//   node --conditions=react-server --import tsx scripts/bench-bad-input.ts
// Targets: each refusal within 15 s (the worker's deadline is 10 s), main-process heap growth under 96 MB
// (the worker has a heap of its own, 256 MB).
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import {
  bigCsv,
  csv,
  garbage,
  GOOD_ROWS,
  HEADER,
  workbookWithCells,
  zipBombXlsx,
} from '../tests/fixtures/bad-input/build-corpus';

const TARGET_SECONDS = 15;
const TARGET_HEAP_GROWTH_MB = 96;

const cases: [string, string, () => Promise<Uint8Array> | Uint8Array][] = [
  ['64 KB of noise named .xlsx', 'noise.xlsx', () => garbage(64 * 1024)],
  [
    'half of a real workbook',
    'torn.xlsx',
    () => workbookWithCells([HEADER.split(','), ...GOOD_ROWS.map((l) => l.split(','))]).subarray(0, 300),
  ],
  ['a csv just over 10 MB', 'huge.csv', () => bigCsv(300_000)],
  ['a csv of 100 000 rows under 10 MB', 'rows.csv', () => bigCsv(100_000)],
  ['a header row of formulas', 'formula-headers.csv', () => csv('=A1,=B1,=C1', 'A01,1,2')],
  ['a zip bomb inflating to 200 MB', 'bomb.xlsx', () => zipBombXlsx(200)],
  ['a zip bomb inflating to 200 MB, declaring 1 KB', 'lying-bomb.xlsx', () => zipBombXlsx(200, 1024)],
  ['a zip bomb inflating to 60 MB (under the unpacked limit)', 'bomb-60.xlsx', () => zipBombXlsx(60)],
];

async function main() {
  console.log('parse of each bad upload: wall time (s), main-process heap growth (MB), outcome');
  for (const [name, filename, build] of cases) {
    const bytes = await build();
    const heapBefore = process.memoryUsage().heapUsed;
    const started = performance.now();
    const result = await parseSpreadsheet(bytes, filename);
    const seconds = (performance.now() - started) / 1000;
    const heapMb = (process.memoryUsage().heapUsed - heapBefore) / 2 ** 20;
    const outcome = result.ok ? 'read' : result.error.code;
    console.log(
      `  ${name.padEnd(58)} ${seconds.toFixed(2).padStart(6)} s ${heapMb.toFixed(1).padStart(7)} MB  ${outcome}`,
    );
  }
  console.log(`  targets: < ${TARGET_SECONDS} s each, < ${TARGET_HEAP_GROWTH_MB} MB heap growth each`);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
