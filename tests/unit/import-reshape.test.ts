import { describe, expect, test } from 'vitest';
import { PLATE_FORMAT_SIZE, type PlateFormat } from '@/lib/domain/plate-formats';
import { headerFingerprint } from '@/lib/imports/fingerprint';
import { guessMapping } from '@/lib/imports/guess-mapping';
import { columnMappingDraftSchema, type ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { afterPrefix, layoutHeaderCells, reshapeSheet } from '@/lib/imports/reshape-table';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';

// Sheets written by hand here (not by Gatewell), with the values each well of the long table must hold.

const sheet = (name: string, rows: Cell[][]): SheetData => ({ name, rows, decimalComma: false });
const known = { knownCompounds: ['GW-1', 'DMSO'], knownTargets: ['Nav1.7', 'Kv7.2'] };

const WIDE_HEADER = [
  'Well',
  'Compound',
  'Conc (uM)',
  'SCN9A I0 (pA)',
  'SCN9A block',
  'KCNQ2 I0 (pA)',
  'KCNQ2 block',
  'Rseal (GOhm)',
];
const wideSheet = () =>
  sheet('Wells', [
    WIDE_HEADER,
    ['A1', 'DMSO', 0, -1000, 0.02, 800, 0.01, 1.5],
    ['A2', 'GW-1', 1, -1200, 0.5, 900, 0.25, 2],
  ]);
const WIDE_MAPPING: ColumnMappingInput = {
  layout: { kind: 'wide', targets: ['SCN9A', 'KCNQ2'] },
  headerRow: 1,
  columns: {
    well: 'Well',
    compound: 'Compound',
    concentration: 'Conc (uM)',
    target: 'Target',
    controlCurrent: 'I0 (pA)',
    block: 'block',
    sealResistance: 'Rseal (GOhm)',
  },
  units: { block: 'fraction' },
  targetValues: { SCN9A: 'Nav1.7', KCNQ2: 'Kv7.2' },
  controls: { negative: ['DMSO'] },
};

describe('wide sheets: a column block per target', () => {
  test('a header opening with a target leaves the readout after it', () => {
    expect(afterPrefix('SCN9A I0 (pA)', 'SCN9A')).toBe('I0 (pA)');
    expect(afterPrefix('Nav1.7_block', 'nav1.7')).toBe('block');
    expect(afterPrefix('SCN9A', 'SCN9A')).toBeNull();
    expect(afterPrefix('SCN9AX block', 'SCN9A')).toBeNull();
  });

  test('the guess finds the target blocks and maps the long table read from them', () => {
    const guess = guessMapping(wideSheet());
    expect(guess.mapping.layout).toEqual({ kind: 'wide', targets: ['SCN9A', 'KCNQ2'] });
    expect(guess.mapping.headerRow).toBe(1);
    expect(guess.mapping.columns).toMatchObject({
      well: 'Well',
      target: 'Target',
      controlCurrent: 'I0 (pA)',
      block: 'block',
      sealResistance: 'Rseal (GOhm)',
    });
  });

  test('each row becomes a row per target, shared columns repeated', () => {
    const result = reshapeSheet(wideSheet(), columnMappingDraftSchema.parse(WIDE_MAPPING));
    expect(result?.ok).toBe(true);
    if (!result?.ok) return;
    expect(result.table.sheet.rows).toEqual([
      ['Well', 'Compound', 'Conc (uM)', 'Rseal (GOhm)', 'Target', 'I0 (pA)', 'block'],
      ['A1', 'DMSO', 0, 1.5, 'SCN9A', -1000, 0.02],
      ['A1', 'DMSO', 0, 1.5, 'KCNQ2', 800, 0.01],
      ['A2', 'GW-1', 1, 2, 'SCN9A', -1200, 0.5],
      ['A2', 'GW-1', 1, 2, 'KCNQ2', 900, 0.25],
    ]);
  });

  test('the plate holds both targets of every well, with the block as given', () => {
    const preview = validatePlateSheet(wideSheet(), WIDE_MAPPING, known);
    expect(preview.fileProblems).toEqual([]);
    expect(preview.issues).toEqual([]);
    expect(preview.plate?.targets).toEqual(['Nav1.7', 'Kv7.2']);
    const a2 = preview.plate?.wells.find((w) => w.position === 'A02');
    expect(a2?.sealResistance_GOhm).toBe(2);
    expect(a2?.readouts.map((r) => [r.target, r.controlCurrent_pA, r.givenBlock])).toEqual([
      ['Nav1.7', -1200, 0.5],
      ['Kv7.2', 900, 0.25],
    ]);
  });

  test('a block may hold the currents before and after compound instead of the block', () => {
    const rows: Cell[][] = [
      ['Well', 'Compound', 'Conc (uM)', 'SCN9A I control (pA)', 'SCN9A I compound (pA)'],
      ['A1', 'GW-1', 1, -1000, -400],
    ];
    rows[0]!.push('KCNQ2 I control (pA)', 'KCNQ2 I compound (pA)');
    rows[1]!.push(800, 600);
    const guess = guessMapping(sheet('Wells', rows));
    expect(guess.mapping.layout).toEqual({ kind: 'wide', targets: ['SCN9A', 'KCNQ2'] });
    const preview = validatePlateSheet(
      sheet('Wells', rows),
      { ...guess.mapping, targetValues: { SCN9A: 'Nav1.7', KCNQ2: 'Kv7.2' } },
      known,
    );
    expect(preview.issues).toEqual([]);
    expect(
      preview.plate?.wells[0]?.readouts.map((r) => [r.target, r.controlCurrent_pA, r.compoundCurrent_pA]),
    ).toEqual([
      ['Nav1.7', -1000, -400],
      ['Kv7.2', 800, 600],
    ]);
  });

  test('an issue names the cell of the file, not of the long table', () => {
    const bad = wideSheet();
    bad.rows[2]![6] = 'lots';
    const preview = validatePlateSheet(bad, WIDE_MAPPING, known);
    const issue = preview.issues.find((i) => i.severity === 'error');
    expect(issue).toMatchObject({ row: 3, column: { letter: 'G', header: 'KCNQ2 block' }, field: 'block' });
    expect(issue?.message).toMatch(/^Sheet "Wells", row 3, column G "KCNQ2 block": /);
  });

  test('a well given twice names the file rows in its message', () => {
    const twice = wideSheet();
    twice.rows.push(['A2', 'GW-1', 1, -1100, 0.4, 950, 0.2, 2]);
    const preview = validatePlateSheet(twice, WIDE_MAPPING, known);
    const messages = preview.issues.filter((i) => i.code === 'duplicate_readout').map((i) => i.message);
    expect(messages).toEqual([
      'Sheet "Wells", row 4, column A "Well": well A02 with target Nav1.7 is already given in row 3; each well has one row per target.',
      'Sheet "Wells", row 4, column A "Well": well A02 with target Kv7.2 is already given in row 3; each well has one row per target.',
    ]);
  });

  test('a target block lacking a column the other has is a file problem', () => {
    const ragged = sheet('Wells', [
      WIDE_HEADER.filter((h) => h !== 'KCNQ2 block'),
      ['A1', 'DMSO', 0, -1, 0.1, 2, 1],
    ]);
    const preview = validatePlateSheet(ragged, WIDE_MAPPING, known);
    expect(preview.plate).toBeNull();
    expect(preview.fileProblems.map((p) => [p.code, p.message])).toEqual([
      [
        'unreadable_layout',
        'Sheet "Wells", row 1: the column block of "KCNQ2" has no "block" column, which the block of "SCN9A" has; every target\'s block needs the same columns.',
      ],
    ]);
  });

  test('headers of one target with qualifiers are not taken for target blocks', () => {
    const long = sheet('Data', [
      ['Well', 'Compound', 'Conc (uM)', 'Target', 'Control current (nA)', 'Compound current (nA)'],
      ['A1', 'GW-1', 1, 'Nav1.7', -1, -0.5],
    ]);
    expect(guessMapping(long).mapping.layout).toEqual({ kind: 'long' });
  });
});

// A grid sheet: "Plate" and "Target" lines, a blank line, then per block a title, a row of column
// numbers and a row per plate row led by its letter, and a blank line.
const BLOCKS = ['Role', 'Compound', 'Conc (uM)', 'I before (pA)', 'I after (pA)'] as const;

function letters(index: number): string {
  return index < 26 ? String.fromCharCode(65 + index) : `A${String.fromCharCode(65 + index - 26)}`;
}

function gridSheet(format: PlateFormat, value: (block: number, r: number, c: number) => Cell): SheetData {
  const { rows, columns } = PLATE_FORMAT_SIZE[format];
  const out: Cell[][] = [['Plate', 'P-0001'], ['Target', 'hNav1.7'], []];
  BLOCKS.forEach((title, b) => {
    out.push([title]);
    out.push([null, ...Array.from({ length: columns }, (_, c) => c + 1)]);
    for (let r = 0; r < rows; r += 1)
      out.push([letters(r), ...Array.from({ length: columns }, (_, c) => value(b, r, c))]);
    out.push([]);
  });
  return sheet('Grids', out);
}

/** Column 1 holds the vehicle, the rest GW-1 at a concentration of the column number. */
const wellValue = (block: number, r: number, c: number): Cell =>
  [c === 0 ? 'vehicle' : 'test', c === 0 ? 'DMSO' : 'GW-1', c, -1000 - r, -1000 + 10 * c][block]!;

const GRID_MAPPING: ColumnMappingInput = {
  layout: { kind: 'grid', constants: ['Target'] },
  headerRow: 4,
  columns: {
    well: 'Well',
    role: 'Role',
    compound: 'Compound',
    concentration: 'Conc (uM)',
    target: 'Target',
    controlCurrent: 'I before (pA)',
    compoundCurrent: 'I after (pA)',
  },
  targetValues: { 'hNav1.7': 'Nav1.7' },
};

describe('plate-shaped grids: a block per readout', () => {
  test.each<[PlateFormat, string]>([
    [96, 'H12'],
    [384, 'P24'],
    [1536, 'AF48'],
  ])('a %i-well grid becomes a row per well, the last %s', (format, last) => {
    const grids = gridSheet(format, wellValue);
    const guess = guessMapping(grids);
    expect(guess.mapping.layout).toEqual({ kind: 'grid', constants: ['Target'] });
    expect(guess.mapping.headerRow).toBe(4);
    expect(guess.mapping.columns).toMatchObject({
      well: 'Well',
      role: 'Role',
      compound: 'Compound',
      concentration: 'Conc (uM)',
      target: 'Target',
    });
    const result = reshapeSheet(grids, columnMappingDraftSchema.parse(GRID_MAPPING));
    if (!result?.ok) throw new Error('not read');
    const { rows } = result.table.sheet;
    expect(rows[0]).toEqual(['Well', 'Target', ...BLOCKS]);
    expect(rows).toHaveLength(format + 1);
    expect(rows[2]).toEqual(['A02', 'hNav1.7', 'test', 'GW-1', 1, -1000, -990]);
    const { columns, rows: plateRows } = PLATE_FORMAT_SIZE[format];
    expect(rows.at(-1)).toEqual([
      last,
      'hNav1.7',
      'test',
      'GW-1',
      columns - 1,
      -1000 - (plateRows - 1),
      -1000 + 10 * (columns - 1),
    ]);

    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    expect(preview.fileProblems).toEqual([]);
    expect(preview.issues).toEqual([]);
    expect(preview.plate?.format).toBe(format);
    expect(preview.plate?.wells).toHaveLength(format);
    expect(preview.plate?.targets).toEqual(['Nav1.7']);
    const b5 = preview.plate?.wells.find((w) => w.position === 'B05');
    expect(b5).toMatchObject({ role: 'test', compound: 'GW-1', concentration_uM: 4 });
    expect(b5?.readouts[0]).toMatchObject({ controlCurrent_pA: -1001, compoundCurrent_pA: -960 });
    expect(preview.plate?.wells.find((w) => w.position === 'C01')?.role).toBe('vehicle');
  });

  test('empty wells (blank in every grid) are left out', () => {
    const grids = gridSheet(96, (b, r, c) => (c === 11 ? null : wellValue(b, r, c)));
    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    expect(preview.plate?.wells).toHaveLength(88);
  });

  test("a grid cell's issue names its grid, well and cell of the file", () => {
    // Block 4 ("I after") of a 96-well grid: title in row 4 + 4 × 11 = 48, numbers in 49, row B in 51.
    const grids = gridSheet(96, (b, r, c) => (b === 4 && r === 1 && c === 4 ? 'high' : wellValue(b, r, c)));
    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    const errors = preview.issues.filter((i) => i.severity === 'error');
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ row: 51, column: { letter: 'F', header: 'I after (pA)' } });
    expect(errors[0]!.message).toMatch(
      /^Sheet "Grids", row 51, column F \(grid "I after \(pA\)", well B05\): /,
    );
  });

  test('a mapped readout with no grid of that title is a file problem naming it', () => {
    const preview = validatePlateSheet(
      gridSheet(96, wellValue),
      { ...GRID_MAPPING, columns: { ...GRID_MAPPING.columns, sealResistance: 'Seal (GOhm)' } },
      known,
    );
    expect(preview.plate).toBeNull();
    expect(preview.fileProblems).toHaveLength(1);
    expect(preview.fileProblems[0]!.code).toBe('missing_column');
    expect(preview.fileProblems[0]!.message).toContain(
      'Sheet "Grids", row 4: no grid is titled "Seal (GOhm)" (chosen for the',
    );
  });

  test('a grid with a row letter missing is a file problem naming the grid', () => {
    const grids = gridSheet(96, wellValue);
    // Drop row H of the third grid ("Conc (uM)": title in row 26, rows A–H in 28–35).
    grids.rows.splice(34, 1);
    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    expect(preview.plate).toBeNull();
    expect(preview.fileProblems.map((p) => [p.code, p.message])).toEqual([
      [
        'unreadable_layout',
        'Sheet "Grids", row 28, column A: the grid "Conc (uM)" (title in row 26) has rows A–G under 12 columns; a grid of 12 columns has rows A–H.',
      ],
    ]);
  });

  test('a value right of a grid is a file problem', () => {
    const grids = gridSheet(96, wellValue);
    grids.rows[6]![14] = 'stray';
    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    expect(preview.fileProblems.map((p) => p.message)).toEqual([
      'Sheet "Grids", row 7, column O: the grid "Role" (title in row 4) has a value beyond its column 12 in row B; a grid\'s rows end at its last column number.',
    ]);
  });

  test('a grid without a title is a file problem', () => {
    const grids = gridSheet(96, wellValue);
    grids.rows[14] = [];
    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    expect(preview.fileProblems[0]!.code).toBe('unreadable_layout');
    expect(preview.fileProblems[0]!.message).toMatch(
      /^Sheet "Grids", row 16, column B: a plate grid has column numbers here but no title/,
    );
  });

  test('a missing key/value line read as a column is a file problem', () => {
    const grids = gridSheet(96, wellValue);
    grids.rows[1] = [];
    const preview = validatePlateSheet(grids, GRID_MAPPING, known);
    expect(preview.fileProblems.map((p) => p.code)).toEqual(['unreadable_layout']);
    expect(preview.fileProblems[0]!.message).toContain('the key "Target"');
  });

  test("a grid layout's fingerprint is its grids' titles, whatever the values and the barcode", () => {
    const layout = columnMappingDraftSchema.parse(GRID_MAPPING).layout;
    const one = gridSheet(96, wellValue);
    const two = gridSheet(96, (b, r, c) => (b === 2 ? 2 * c : wellValue(b, r, c)));
    two.rows[0] = ['Plate', 'P-0002'];
    const print = (s: SheetData) => headerFingerprint(layoutHeaderCells(s, layout, 4));
    expect(print(one)).toBe('grid|role|compound|concum|ibeforepa|iafterpa');
    expect(print(two)).toBe(print(one));
  });
});

describe('the layout field of a mapping', () => {
  test('an older mapping without it is long', () => {
    expect(columnMappingDraftSchema.parse({ headerRow: 2 }).layout).toEqual({ kind: 'long' });
  });

  test('a wide layout needs its targets', () => {
    expect(columnMappingDraftSchema.safeParse({ layout: { kind: 'wide', targets: [] } }).success).toBe(false);
  });
});
