import { describe, expect, test } from 'vitest';
import { guessMapping } from '@/lib/imports/guess-mapping';
import type { ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { readQuantity, type QuantityResult } from '@/lib/imports/read-cell';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';

describe('missing values', () => {
  test.each<[Cell, string[], QuantityResult]>([
    ['NaN', ['nan'], { ok: true, value: null }],
    ['nan', ['nan'], { ok: true, value: null }],
    [Number.NaN, ['nan'], { ok: true, value: null }],
    ['NaN', [], { ok: false, code: 'not_finite', detail: '"NaN" is not a finite number' }],
    ['Inf', ['nan'], { ok: false, code: 'not_finite', detail: '"Inf" is not a finite number' }],
    ['n/a', [], { ok: true, value: null }],
    ['failed', ['failed'], { ok: true, value: null }],
    ['failed', [], { ok: false, code: 'not_numeric', detail: '"failed" is not a number' }],
    ['12', ['nan'], { ok: true, value: 12 }],
  ])('%j with the extra words %j', (cell, words, expected) => {
    expect(readQuantity(cell, 'current', 'pA', false, new Set(words))).toEqual(expected);
  });
});

const sheet = (rows: Cell[][]): SheetData => ({ name: 'Run', rows, decimalComma: false });
const HEADER: Cell[] = [
  'Cell',
  'Role',
  'Compound',
  'Conc (µM)',
  'I control (pA)',
  'I compound (pA)',
  'Cm (pF)',
];
const MAPPING: ColumnMappingInput = {
  columns: {
    well: 'Cell',
    role: 'Role',
    compound: 'Compound',
    concentration: 'Conc (µM)',
    controlCurrent: 'I control (pA)',
    compoundCurrent: 'I compound (pA)',
    capacitance: 'Cm (pF)',
  },
  roleValues: { VC: 'vehicle', TA: 'test' },
  fixedTarget: 'Nav1.7',
  missing: { notANumber: true },
};
const OPTIONS = { knownCompounds: ['GW-0001', 'GW-0002'], knownTargets: ['Nav1.7'] };
const CELL_B2: Cell[][] = [
  ['B02', 'TA', 'GW-0001', 0.1, -2000, -1800, 20],
  ['B02', 'TA', 'GW-0001', 1, -2000, -1000, 20],
  ['B02', 'TA', 'GW-0001', 10, -2000, 'NaN', 20],
];

describe('the guess of NaN as the missing marker', () => {
  test.each<[string, number, boolean]>([
    ['NaN in one row stays an error', 1, false],
    ['NaN in two rows stays an error', 2, false],
    ['NaN in three rows is the missing marker', 3, true],
  ])('%s', (_name, count, expected) => {
    const clean: Cell[][] = [...CELL_B2.slice(0, 2), ['B02', 'TA', 'GW-0001', 10, -2000, -500, 20]];
    const rows = clean.map((row, i) => row.map((cell, j) => (j === 6 && i < count ? 'NaN' : cell)));
    expect(guessMapping(sheet([HEADER, ...rows])).mapping.missing.notANumber).toBe(expected);
  });
});

describe('cumulative application as rows of one cell', () => {
  test('by default the rows are applications: one well, a readout per concentration, NaN missing', () => {
    const preview = validatePlateSheet(
      sheet([HEADER, ['A01', 'VC', 'DMSO', null, -2100, -1900, 'NaN'], ...CELL_B2]),
      MAPPING,
      OPTIONS,
    );
    expect(preview.issues.map((i) => i.message)).toEqual([]);
    const [vehicle, cell] = preview.plate!.wells;
    expect(vehicle!.capacitance_pF).toBeNull();
    expect(vehicle!.readouts.map((r) => r.concentration_uM)).toEqual([undefined]);
    expect(cell!.concentration_uM).toBe(10);
    expect(cell!.readouts.map((r) => [r.concentration_uM, r.compoundCurrent_pA])).toEqual([
      [0.1, -1800],
      [1, -1000],
      [10, null],
    ]);
  });

  test.each<[string, Partial<ColumnMappingInput>, Cell[][], string[]]>([
    [
      'application "single" keeps one concentration per well',
      { application: 'single' },
      CELL_B2.slice(0, 2),
      [
        'Sheet "Run", row 3, column A "Cell": well B02 with target Nav1.7 is already given in row 2; each well has one row per target.',
        'Sheet "Run", row 3, column C "Compound": well B02 holds test GW-0001 at 1 µM here but test GW-0001 at 0.1 µM in row 2; a well holds one compound at one concentration.',
      ],
    ],
    [
      'one concentration given twice, the mapping saying cumulative',
      { application: 'cumulative' },
      [CELL_B2[0]!, CELL_B2[0]!],
      [
        'Sheet "Run", row 3, column A "Cell": well B02 with target Nav1.7 at 0.1 µM is already given in row 2; each application of a cell has one row per target.',
      ],
    ],
    [
      'another compound in the same cell',
      { application: 'cumulative' },
      [CELL_B2[0]!, ['B02', 'TA', 'GW-0002', 1, -2000, -1000, 20]],
      [
        'Sheet "Run", row 3, column C "Compound": well B02 holds test GW-0002 at 1 µM here but test GW-0001 at 0.1 µM in row 2; a well holds one compound at one concentration.',
      ],
    ],
    [
      'NaN read as an error when the mapping says so',
      { missing: { notANumber: false } },
      [CELL_B2[2]!],
      ['Sheet "Run", row 2, column F "I compound (pA)": compound current: "NaN" is not a finite number.'],
    ],
    [
      'one concentration given twice, by guess',
      {},
      [CELL_B2[0]!, CELL_B2[0]!],
      [
        'Sheet "Run", row 3, column A "Cell": well B02 with target Nav1.7 is already given in row 2; each well has one row per target.',
      ],
    ],
  ])('%s', (_name, extra, rows, messages) => {
    const preview = validatePlateSheet(sheet([HEADER, ...rows]), { ...MAPPING, ...extra }, OPTIONS);
    expect(preview.issues.map((i) => i.message)).toEqual(messages);
  });
});
