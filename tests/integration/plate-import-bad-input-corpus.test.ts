import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { importRowCounts } from '../support/import-counts';
import { potassiumImportSetup } from '../support/demo-scenario';
import { runScript } from '../support/run-script';
import {
  bigCsv,
  csv,
  csvWithout,
  csvWithRoles,
  garbage,
  GOOD_ROWS,
  HEADER,
  RUN_NOTES,
  utf16le,
  workbookWithCells,
  zipBombXlsx,
} from '../fixtures/bad-input/build-corpus';

// The bad-input corpus (tests/fixtures/bad-input/build-corpus.ts) through the real import service: each
// file gets a clear message and writes nothing. plate-import-bad-input.test.ts holds the basic per-cell
// cases; these are the hostile and odd files. How long each refusal takes and how much heap it costs the
// main process are figures, printed by scripts/bench-bad-input.ts, not checked here: the limits
// that bound them (size, unpacked size, rows, worker heap and deadline) are each checked by the refusal
// they give (here and in tests/unit/import-parse.test.ts).

describe('the bad-input corpus is refused clearly and nothing is written', () => {
  let biologist: Actor;
  let screenId: string;

  beforeAll(async () => {
    ({ biologist, screenId } = await potassiumImportSetup());
  });
  afterAll(() => db().close());

  const upload = (bytes: Uint8Array, filename: string) => ({
    screenId,
    bytes,
    filename,
    mediaType: 'application/octet-stream',
  });

  /** Inspect, then commit with the proposed mapping (and a template name, so a template write would show). */
  async function importAll(bytes: Uint8Array, filename: string) {
    const inspection = await inspectUpload(biologist, upload(bytes, filename));
    const sheet = inspection.sheets[0]!;
    return commitImport(biologist, {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
      label: 'BAD-CORPUS',
      templateName: 'bad corpus',
    });
  }

  /** Runs the import and returns its refusal, having checked that nothing was written. */
  async function refusal(bytes: Uint8Array, filename: string): Promise<AppError> {
    const before = await importRowCounts();
    const error = await importAll(bytes, filename).then(
      () => null,
      (e: unknown) => e,
    );
    expect(error, `${filename} was accepted`).toBeInstanceOf(AppError);
    expect(await importRowCounts()).toEqual(before);
    return error as AppError;
  }

  test.each([
    [
      '64 KB of noise named .xlsx',
      () => garbage(64 * 1024),
      'noise.xlsx',
      'invalid',
      /noise\.xlsx (holds binary data|is not a spreadsheet)/,
    ],
    [
      'half of a real workbook',
      () => workbookWithCells([HEADER.split(','), ...GOOD_ROWS.map((l) => l.split(','))]).subarray(0, 300),
      'torn.xlsx',
      'invalid',
      // The workbook library never finishes this file (tests/unit/import-parse.test.ts): the deadline stops it.
      /^torn\.xlsx took longer than 10 s to read and was stopped\./,
    ],
    [
      'a csv just over 10 MB',
      () => bigCsv(300_000),
      'huge.csv',
      'too_large',
      /huge\.csv is 1\d(\.\d)? MB; Gatewell reads files up to 10 MB/,
    ],
    [
      'a csv of 100 000 rows under 10 MB',
      () => bigCsv(100_000),
      'rows.csv',
      'invalid',
      /^rows\.csv is too big to import: it has more than 20000 rows\.$/,
    ],
    [
      'headers that name nothing Gatewell knows',
      () => csv('Colour,Shape,Size', 'red,round,3', 'blue,square,4'),
      'headers.csv',
      'invalid',
      /^The sheet has 6 error\(s\); first: Sheet "headers", row 1: no header row found: this row names none of the columns a plate needs \(well position, compound identifier, concentration, target, control current, compound current\)\. On the mapping step, set the header row/,
    ],
    [
      'a header row of formulas',
      () => csv('=A1,=B1,=C1', 'A01,1,2'),
      'formula-headers.csv',
      'invalid',
      /^The sheet has \d+ error\(s\); first: Sheet "formula-headers", row 1: no header row found/,
    ],
  ])('%s', async (_name, build, filename, code, message) => {
    const error = await refusal(build(), filename);
    expect(error.code).toBe(code);
    expect(error.message).toMatch(message);
  });

  // Whole-file errors: the exact message people read, what to do included.
  test.each([
    [
      'a text file renamed to .xlsx',
      () => new TextEncoder().encode(RUN_NOTES),
      'run-notes.xlsx',
      'run-notes.xlsx is text, not a spreadsheet: its lines are not split into columns by commas, semicolons or tabs. Upload the export the instrument wrote (xlsx, xls or csv).',
    ],
    [
      'a file of 0 bytes',
      () => new Uint8Array(0),
      'plate-07.xlsx',
      'plate-07.xlsx is empty (0 bytes): the file holds nothing to import. Export the plate from the instrument again and upload that file.',
    ],
    [
      'a missing required column',
      () => csvWithout('Conc (uM)'),
      'no-conc.csv',
      'The sheet has 1 error(s); first: Sheet "no-conc", row 1: no column is chosen for the concentration, which every plate needs. On the mapping step, choose the column that holds the concentration. If the export has no such column, set the instrument to write it: Gatewell cannot store a plate without the concentration.',
    ],
    [
      'a header row and nothing under it',
      () => csv(HEADER),
      'header-only.csv',
      'The sheet has 1 error(s); first: Sheet "header-only": the sheet has a header row (row 1) but no data rows below it. Check the header row on the mapping step (now row 1): the wells are read from the rows below it. If the sheet really holds no wells, export the plate again.',
    ],
  ])('%s is refused with its whole-file message', async (_name, build, filename, message) => {
    const error = await refusal(build(), filename);
    expect(error.code).toBe('invalid');
    expect(error.message).toBe(message);
  });

  test('role words left unmapped are refused with one error naming each, by the service and by the script’s dry run', async () => {
    // "Test" is a word the guess knows; "carrier" and "panel" are not, and no mapping places them.
    const bytes = csvWithRoles('carrier', 'panel', 'Test', 'panel');
    const expected =
      'Sheet "roles", row 1, column B "Role": the well-role column holds words Gatewell cannot place: "carrier", "panel"; on the mapping step assign each to negative control, positive control, test or empty.';
    const error = await refusal(bytes, 'roles.csv');
    expect(error.code).toBe('invalid');
    expect(error.message).toBe(`The sheet has 1 error(s); first: ${expected}`);

    // The same file through scripts/import-plate.ts --dry-run --json, as a child process on this database.
    const dir = mkdtempSync(join(tmpdir(), 'gatewell-bad-roles-'));
    try {
      const file = join(dir, 'roles.csv');
      writeFileSync(file, bytes);
      const before = await importRowCounts();
      const out = runScript([
        file,
        '--screen',
        'Potassium counter-screen',
        '--as',
        biologist.email,
        '--dry-run',
        '--json',
      ]);
      expect(out.stderr).toBe('');
      expect(out.code).toBe(1);
      const facts = JSON.parse(out.stdout) as {
        errors: string[];
        wellCount: number;
        template: string | null;
      };
      expect(facts.errors).toEqual([expected, 'The sheet holds no wells.']);
      expect(facts.wellCount).toBe(0);
      expect(facts.template).toBeNull();
      expect(await importRowCounts()).toEqual(before);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    // The script is a fresh Node process: several seconds on a busy machine.
  }, 120_000);

  test('missing optional QC columns: the check step names the rules not applied and nothing is written', async () => {
    const before = await importRowCounts();
    const inspection = await inspectUpload(
      biologist,
      upload(csvWithout('Rs (MOhm)', 'Cm (pF)'), 'no-rs.csv'),
    );
    const sheet = inspection.sheets[0]!;
    const preview = await previewImport(biologist, {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
    });
    expect(preview.ok).toBe(true);
    expect(preview.fileProblems).toEqual([]);
    expect(preview.qcRulesNotApplied.map((r) => r.message)).toEqual([
      'The series resistance rule (1 to 25 MΩ) was not applied: no well has a series resistance. The other QC rules, Z′ and the fits still run.',
      'The capacitance rule (1 to 100 pF) was not applied: no well has a capacitance. The other QC rules, Z′ and the fits still run.',
    ]);
    // The corpus's good rows pass every rule that applies.
    expect(preview.qc).toEqual({});
    expect(await importRowCounts()).toEqual(before);
  });

  // The parse worker unpacks at most 64 MB of a zip workbook (lib/imports/parse-worker.mjs): these fail if
  // that limit is gone (the workbook library would start on 200 MB of sheet XML, and the refusal would be
  // the memory or time limit's, or a missing column's), or if a lying size in the zip's headers got past it.
  test.each([
    ['declaring its true size', undefined],
    ['declaring 1 KB', 1024],
  ])(
    'a zip bomb (an xlsx of about 200 KB that inflates to 200 MB) %s is refused for what it unpacks to',
    async (_name, declaredSize) => {
      const bomb = await zipBombXlsx(200, declaredSize);
      expect(bomb.length).toBeLessThan(2 ** 20);
      const error = await refusal(bomb, 'bomb.xlsx');
      expect(error.code).toBe('too_large');
      expect(error.details).toEqual({ code: 'too_large' });
      expect(error.message).toBe(
        'bomb.xlsx unpacks to more than 64 MB; Gatewell reads workbooks that unpack to at most 64 MB. Remove extra sheets or rows and upload it again.',
      );
    },
  );

  test('formulas are never evaluated: a csv formula is text, and an xlsx formula without a stored value is empty', async () => {
    const fromCsv = await refusal(
      csv(HEADER, ...GOOD_ROWS, 'A05,GW-0001,1,Kv7.2,=400+400,700,1.8,4,18'),
      'formula.csv',
    );
    expect(fromCsv.message).toMatch(/row 6, column E "I control \(pA\)"/);
    expect(fromCsv.message).toContain('=400+400');

    const rows: (string | number | { formula: string })[][] = [
      HEADER.split(','),
      ...GOOD_ROWS.map((l) =>
        l.split(',').map((v) => (v !== '' && !Number.isNaN(Number(v)) ? Number(v) : v)),
      ),
    ];
    rows.push(['A05', 'GW-0001', 1, 'Kv7.2', { formula: '400+400' }, 700, 1.8, 4, 18]);
    const workbook = upload(workbookWithCells(rows), 'formula.xlsx');
    const inspected = await inspectUpload(biologist, workbook);
    const sheet = inspected.sheets[0]!;
    expect(sheet.sample[4]).toEqual(['A05', 'GW-0001', 1, 'Kv7.2', null, 700, 1.8, 4, 18]);
    const preview = await previewImport(biologist, {
      draftId: inspected.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
    });
    expect(preview.rows.find((r) => r.row === 6)!.values.controlCurrent_pA).toBeNull();
  });

  test('HTML in cells comes back from the preview as the same plain text, never as markup', async () => {
    const markup = '<img src=x onerror=alert(1)>';
    const script = "<script>alert('gw')</script>";
    const bytes = csv(
      HEADER,
      ...GOOD_ROWS,
      `A05,"${markup}",1,Kv7.2,800,700,1.8,4,18`,
      `A06,GW-0001,1,"${script}",800,700,1.8,4,18`,
    );
    const inspection = await inspectUpload(biologist, upload(bytes, 'markup.csv'));
    const sheet = inspection.sheets[0]!;
    const preview = await previewImport(biologist, {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
    });
    const byRow = new Map(preview.rows.map((r) => [r.row, r]));
    expect(byRow.get(6)!.values.compound).toBe(markup);
    expect(byRow.get(6)!.status).toBe('error');
    expect(byRow.get(7)!.values.target).toBe(script);
    // What the preview route sends is JSON of these values: the markup travels as an escaped string.
    const json = JSON.stringify(preview);
    expect(JSON.parse(json).rows.find((r: { row: number }) => r.row === 6).values.compound).toBe(markup);
    expect(preview.unknownCompounds.map((c) => c.identifier)).toContain(markup);
    await refusal(bytes, 'markup.csv');
  });

  test.each([
    ['NaN', 'NaN'],
    ['Infinity', 'Infinity'],
    ['-Infinity', '-Infinity'],
    ['an overflowing number', '1e999'],
  ])('a control current of %s is refused at its cell', async (_name, value) => {
    const error = await refusal(
      csv(HEADER, ...GOOD_ROWS, `A05,GW-0001,1,Kv7.2,${value},700,1.8,4,18`),
      'number.csv',
    );
    expect(error.message).toMatch(/row 6, column E "I control \(pA\)"/);
  });

  test.each([
    ['a NaN concentration', 'A05,GW-0001,NaN,Kv7.2,800,700,1.8,4,18', /row 6, column C "Conc \(uM\)"/],
    [
      'a zero concentration on a compound well',
      'A05,GW-0001,0,Kv7.2,800,700,1.8,4,18',
      /row 6, column C "Conc \(uM\)"/,
    ],
    [
      'a negative seal resistance',
      'A05,GW-0001,1,Kv7.2,800,700,-1.8,4,18',
      /row 6, column G "Rseal \(GOhm\)"/,
    ],
    ['an infinite capacitance', 'A05,GW-0001,1,Kv7.2,800,700,1.8,4,Infinity', /row 6, column I "Cm \(pF\)"/],
    ['the same well written two ways', 'A4,GW-0001,3,Kv7.2,810,700,1.8,4,18', /row 6/],
    ['a well given twice with different compounds', 'A03,GW-0002,10,Kv7.2,820,600,1.8,4,18', /row 6/],
  ])('%s is refused at its cell', async (_name, line, message) => {
    const error = await refusal(csv(HEADER, ...GOOD_ROWS, line), 'values.csv');
    expect(error.message).toMatch(message);
  });

  test('wrong encodings: Latin-1 and UTF-16 without a mark are refused by name; UTF-16 with a mark reads like UTF-8', async () => {
    const latin1 = Buffer.from([HEADER.replace('(uM)', '(\u00b5M)'), ...GOOD_ROWS].join('\n'), 'latin1');
    const refusedLatin1 = await refusal(latin1, 'latin1.csv');
    expect(refusedLatin1.message).toMatch(
      /^latin1\.csv is not valid UTF-8 text: byte 0xB5 at offset \d+ \(line 1\)/,
    );

    const text = `${[HEADER, ...GOOD_ROWS].join('\n')}\n`;
    const refusedUtf16 = await refusal(utf16le(text, false), 'utf16.csv');
    expect(refusedUtf16.message).toMatch(/utf16\.csv holds binary data/);

    const marked = utf16le(text, true);
    const inspection = await inspectUpload(biologist, upload(marked, 'utf16-bom.csv'));
    const sheet = inspection.sheets[0]!;
    expect(sheet.headers).toEqual(HEADER.split(','));
    const preview = await previewImport(biologist, {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
    });
    expect(preview.summary.errorRows).toBe(0);
    expect(preview.rows).toHaveLength(GOOD_ROWS.length);
  });
});
