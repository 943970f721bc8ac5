import { describe, expect, test } from 'vitest';
import { guessMapping } from '@/lib/imports/guess-mapping';
import type { ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { isSummaryRow, isUnitsRow, isUnitText } from '@/lib/imports/skip-rows';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';

describe('rows of units', () => {
  test.each<[string, boolean]>([
    ['mM', true],
    ['µM', true],
    ['uM', true],
    ['[nA]', true],
    ['(pA)', true],
    ['MΩ', true],
    ['GOhm', true],
    ['pF', true],
    ['%', true],
    ['fraction', true],
    ['A1', false],
    ['Well', false],
    ['', false],
    ['cpd', false],
  ])('%j is a unit: %s', (text, expected) => {
    expect(isUnitText(text)).toBe(expected);
  });

  test.each<[string, Cell[], boolean]>([
    ['units with blanks', [null, null, 'mM', null, 'nA', 'nA', 'MΩ', 'pF'], true],
    ['one unit', ['', 'pA'], true],
    ['all blank', [null, '', null], false],
    ['a well row', ['A1', 'cpd', 'GW-0001', 0.001, 1.2], false],
    ['a number among units', ['mM', 3], false],
    ['a word among units', ['mM', 'nA', 'Kv7.2'], false],
  ])('%s', (_name, cells, expected) => {
    expect(isUnitsRow(cells)).toBe(expected);
  });
});

describe('summary rows', () => {
  test.each<[string, Cell[], number | null, string[], boolean]>([
    ['mean in the well column', ['Mean', null, 1.5, 2.5], 0, [], true],
    ['count with a number', ['Count', 384], 0, [], true],
    ['SD spelt with a dot', [null, 'Std. dev.', 0.2], 0, [], true],
    ['average after a blank well cell', ['', 'Average', 3], 0, [], true],
    ['a well named A1', ['A1', 'Mean'], 0, [], false],
    ['a running-index well', [12, 'Mean'], 0, [], false],
    ['a running index written as text', ['12', 'Mean'], 0, [], false],
    ['a compound first', ['GW-0001', 1], null, [], false],
    ['a word of the mapping', ['Pooled', 3], 0, ['pooled'], true],
    ['a number first', [3, 'mean'], null, [], false],
  ])('%s', (_name, cells, wellIndex, words, expected) => {
    expect(isSummaryRow(cells, wellIndex, words)).toBe(expected);
  });
});

const HEADER: Cell[] = ['Well', 'Group', 'Compound', 'Concentration', 'Current before', 'Current after'];
const UNITS: Cell[] = [null, null, null, 'mM', 'nA', 'nA'];
const WELLS: Cell[][] = [
  ['A1', 'ctrl-', 'DMSO', 0, 1.2, 1.1],
  ['A2', 'ctrl+', 'REF', 0.01, 1.3, 0.1],
  ['A3', 'cpd', 'GW-0001', 0.001, 1.1, 0.6],
];
const SUMMARY: Cell[][] = [[], ['Mean', null, null, null, 1.2, 0.6], ['Count', 3]];

const sheet = (rows: Cell[][]): SheetData => ({ name: 'Export', rows, decimalComma: false });
const MAPPING: ColumnMappingInput = {
  headerRow: 3,
  columns: {
    well: 'Well',
    role: 'Group',
    compound: 'Compound',
    concentration: 'Concentration',
    controlCurrent: 'Current before',
    compoundCurrent: 'Current after',
  },
  units: { concentration: 'mM', controlCurrent: 'nA', compoundCurrent: 'nA' },
  fixedTarget: 'Kv7.2',
};
const OPTIONS = { knownCompounds: ['GW-0001', 'DMSO', 'REF'], knownTargets: ['Kv7.2'] };
const TITLED = [['Plate P-1', null, 'Exported 2026-12-02'], [], HEADER];

describe('a table with a row of units and summary rows', () => {
  test('both are skipped by default and said so; the wells are read in the mapped units', () => {
    const preview = validatePlateSheet(sheet([...TITLED, UNITS, ...WELLS, ...SUMMARY]), MAPPING, OPTIONS);
    expect(preview.issues.map((i) => i.message)).toEqual([]);
    expect(preview.skippedRows).toEqual([
      { row: 4, reason: 'units' },
      { row: 9, reason: 'summary' },
      { row: 10, reason: 'summary' },
    ]);
    expect(preview.rows.map((r) => r.row)).toEqual([5, 6, 7]);
    expect(preview.rows[2]!.values).toMatchObject({ concentration_uM: 1, controlCurrent_pA: 1100 });
    expect(preview.ok).toBe(true);
  });

  test('unitsRow "no" and skipSummaryRows false read them as wells, with the errors of today', () => {
    const mapping = { ...MAPPING, rows: { unitsRow: 'no' as const, skipSummaryRows: false } };
    const preview = validatePlateSheet(sheet([...TITLED, UNITS, ...WELLS, ...SUMMARY]), mapping, OPTIONS);
    expect(preview.skippedRows).toEqual([]);
    expect(preview.issues.map((i) => i.message)).toEqual([
      'Sheet "Export", row 3, column B "Group": the well-role column holds a word Gatewell cannot place: "3"; on the mapping step assign each to negative control, positive control, test or empty.',
    ]);
    const withoutCount = validatePlateSheet(
      sheet([...TITLED, UNITS, ...WELLS, ...SUMMARY.slice(0, 2)]),
      mapping,
      OPTIONS,
    );
    expect(withoutCount.issues.filter((i) => i.field === 'well').map((i) => i.message)).toEqual([
      'Sheet "Export", row 4, column A "Well": the well position is empty.',
      'Sheet "Export", row 9, column A "Well": "Mean" is not a well position; write it as a row letter and column number, like A1 or A01.',
    ]);
  });

  test('unitsRow "yes" skips the row under the header whatever it holds', () => {
    const mapping = { ...MAPPING, rows: { unitsRow: 'yes' as const } };
    const preview = validatePlateSheet(
      sheet([...TITLED, ['Units:', 'see header'], ...WELLS]),
      mapping,
      OPTIONS,
    );
    expect(preview.skippedRows).toEqual([{ row: 4, reason: 'units' }]);
    expect(preview.ok).toBe(true);
  });

  test('the guess takes the units of columns from the row of units', () => {
    const guess = guessMapping(sheet([...TITLED, UNITS, ...WELLS]));
    expect(guess.mapping.headerRow).toBe(3);
    expect(guess.mapping.units).toMatchObject({
      concentration: 'mM',
      controlCurrent: 'nA',
      compoundCurrent: 'nA',
    });
  });
});
