import { describe, expect, test } from 'vitest';
import { headerFingerprint } from '@/lib/imports/fingerprint';
import { guessMapping } from '@/lib/imports/guess-mapping';
import { columnMappingDraftSchema, type ColumnMappingInput } from '@/lib/imports/mapping-schema';
import {
  findKeyValue,
  guessFactLocators,
  keyValuePairs,
  parseCellAddress,
  readPlateFacts,
} from '@/lib/imports/plate-facts';
import { guessRoleValue, valueKey, type RoleChoice } from '@/lib/imports/role-words';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';
import { matchTemplate, type TemplateSummary } from '@/lib/plates/templates';

describe('role words', () => {
  test.each<[string, RoleChoice | null]>([
    ['vehicle', 'vehicle'],
    ['VEHICLE', 'vehicle'],
    ['DMSO', 'vehicle'],
    ['dmso ', 'vehicle'],
    ['neg', 'vehicle'],
    ['Negative', 'vehicle'],
    ['ctrl-', 'vehicle'],
    ['Ctrl -', 'vehicle'],
    ['ctrl(-)', 'vehicle'],
    ['ctrl neg', 'vehicle'],
    ['CTRL_NEG', 'vehicle'],
    ['neg. ctrl', 'vehicle'],
    ['Negative control', 'vehicle'],
    ['blank', 'vehicle'],
    ['pos', 'reference'],
    ['POSITIVE', 'reference'],
    ['ctrl+', 'reference'],
    ['Ctrl +', 'reference'],
    ['ctrl(+)', 'reference'],
    ['ctrl pos', 'reference'],
    ['Ctrl-Pos', 'reference'],
    ['positive control', 'reference'],
    ['reference', 'reference'],
    ['Ref', 'reference'],
    ['test', 'test'],
    ['Sample', 'test'],
    ['cpd', 'test'],
    ['CMPD', 'test'],
    ['compound', 'test'],
    ['empty', 'empty'],
    ['None', 'empty'],
    ['ctrl', null],
    ['control', null],
    ['std', null],
    ['max', null],
    ['', null],
    ['  ', null],
  ])('%j → %s', (word, choice) => {
    expect(guessRoleValue(word)).toBe(choice);
  });

  test('value keys ignore case and spaces but keep the sign', () => {
    expect(valueKey(' Ctrl + ')).toBe('ctrl+');
    expect(valueKey('ctrl-')).not.toBe(valueKey('ctrl+'));
  });
});

// A small export in the file's own words: role words, a target name, a run-info sheet with the barcode.
const HEADERS = ['Pos', 'Sample ID', 'Dose (nM)', 'Assay', 'I pre (pA)', 'I post (pA)', 'Well type'];
const ROWS: Cell[][] = [
  ['Instrument run 17'],
  HEADERS,
  ['A01', 'GW-0001', 100, 'hNav1.7 peak', -2000, -1800, 'STD'],
  ['A02', 'GW-0001', 1000, 'hNav1.7 peak', -2000, -1000, 'STD'],
  ['A03', 'DMSO', 0, 'hNav1.7 peak', -2000, -1990, 'Ctrl -'],
  ['A04', 'TTX', 1000, 'hNav1.7 peak', -2000, -100, 'Ctrl +'],
  ['A05', null, null, 'hNav1.7 peak', null, null, 'unused'],
  ['A06', 'GW-0002', 300, 'hNav1.7 peak', -2100, -1500, 'std'],
];
const OPTIONS = { knownCompounds: ['GW-0001', 'GW-0002'], knownTargets: ['Nav1.7', 'Kv7.2'] };
const sheetOf = (rows: Cell[][], name = 'Data'): SheetData => ({ name, rows, decimalComma: false });
const mapped = (extra: ColumnMappingInput): ColumnMappingInput => ({
  ...guessMapping(sheetOf(ROWS)).mapping,
  ...extra,
});

describe('value maps applied to rows', () => {
  test('the guess finds the columns of the file', () => {
    const { mapping } = guessMapping(sheetOf(ROWS));
    expect(mapping.headerRow).toBe(2);
    expect(mapping.columns.role).toBe('Well type');
    expect(mapping.columns.target).toBe('Assay');
  });

  test('unmapped role words stop the whole file, naming each once', () => {
    const result = validatePlateSheet(sheetOf(ROWS), mapped({}), OPTIONS);
    expect(result.ok).toBe(false);
    expect(result.rows).toEqual([]);
    expect(result.issues.map((issue) => [issue.code, issue.message])).toEqual([
      [
        'unknown_role',
        'Sheet "Data", row 2, column G "Well type": the well-role column holds a word Gatewell cannot place: "STD"; on the mapping step assign each to negative control, positive control, test or empty.',
      ],
    ]);
  });

  test('mapped role words and target values give each well its role and the screen target', () => {
    const result = validatePlateSheet(
      sheetOf(ROWS),
      mapped({ roleValues: { std: 'test' }, targetValues: { 'hNav1.7 peak': 'Nav1.7' } }),
      OPTIONS,
    );
    expect(result.issues).toEqual([]);
    expect(result.ok).toBe(true);
    expect(result.emptyWells).toBe(1);
    expect(result.rows.map((row) => [row.values.well, row.values.role, row.values.target])).toEqual([
      ['A01', 'test', 'Nav1.7'],
      ['A02', 'test', 'Nav1.7'],
      ['A03', 'vehicle', 'Nav1.7'],
      ['A04', 'reference', 'Nav1.7'],
      ['A06', 'test', 'Nav1.7'],
    ]);
  });

  test('a role value mapped to empty is skipped; the map beats the guess', () => {
    const result = validatePlateSheet(
      sheetOf(ROWS),
      mapped({
        roleValues: { STD: 'test', 'ctrl +': 'empty' },
        targetValues: { 'hNav1.7 peak': 'Nav1.7' },
      }),
      OPTIONS,
    );
    expect(result.emptyWells).toBe(2);
    expect(result.rows.map((row) => row.values.well)).toEqual(['A01', 'A02', 'A03', 'A06']);
  });

  test('a screen alias maps the target without a value map; an unmapped target is reported per row', () => {
    const withAlias = validatePlateSheet(sheetOf(ROWS), mapped({ roleValues: { STD: 'test' } }), {
      ...OPTIONS,
      targetAliases: { 'HNAV1.7 PEAK': 'Nav1.7' },
    });
    expect(withAlias.ok).toBe(true);
    const without = validatePlateSheet(sheetOf(ROWS), mapped({ roleValues: { STD: 'test' } }), OPTIONS);
    expect(without.unknownTargets).toEqual([{ name: 'hNav1.7 peak', rows: [3, 4, 5, 6, 8] }]);
  });

  test('with no role column, named control compounds and concentration 0 give the controls', () => {
    const rows: Cell[][] = [
      ['Well', 'Compound', 'Conc (uM)', 'I control', 'I compound'],
      ['A01', 'GW-0001', 1, -2000, -1000],
      ['A02', 'BUF-7', 0, -2000, -1990],
      ['A03', 'TTX', 1, -2000, -50],
      ['A04', 'GW-0002', 0, -2000, -1995],
    ];
    const base = { ...guessMapping(sheetOf(rows)).mapping, fixedTarget: 'Nav1.7' };
    const roles = (extra: ColumnMappingInput) =>
      validatePlateSheet(sheetOf(rows), { ...base, ...extra }, OPTIONS).rows.map((r) => r.values.role);
    expect(roles({ controls: { negative: ['buf-7'], positive: ['TTX'], zeroConcentration: false } })).toEqual(
      ['test', 'vehicle', 'reference', 'test'],
    );
    expect(roles({ controls: { negative: [], positive: ['TTX'], zeroConcentration: true } })).toEqual([
      'test',
      'vehicle',
      'reference',
      'vehicle',
    ]);
  });

  test('a version 1 mapping still applies: its marker words become the value map and control compounds', () => {
    const v1 = {
      version: 1,
      columns: { role: 'Well type' },
      markers: { vehicle: ['VEH', 'BUFFER'], reference: ['REF', 'TTX'], test: ['TEST', 'STD'] },
    };
    const mapping = columnMappingDraftSchema.parse(v1);
    expect(mapping.version).toBe(2);
    expect(mapping.roleValues).toEqual({ BUFFER: 'vehicle', TTX: 'reference', STD: 'test' });
    expect(mapping.controls).toEqual({ negative: ['BUFFER'], positive: ['TTX'], zeroConcentration: false });
    expect('markers' in mapping).toBe(false);
  });
});

describe('plate facts outside the table', () => {
  const runInfo = sheetOf(
    [
      ['Run information'],
      [],
      ['Plate barcode: XYZ123'],
      ['Run date', null, '2026-11-30'],
      ['Cell line', 'HEK293-Nav1.7'],
      ['Temp.', '22 °C'],
      ['Operator:', 'R. Okafor'],
    ],
    'Run info',
  );

  test('key/value pairs: colon in one cell, or the next written cell', () => {
    expect(keyValuePairs(runInfo).map((p) => [p.row, p.key, p.value])).toEqual([
      [3, 'Plate barcode', 'XYZ123'],
      [4, 'Run date', '2026-11-30'],
      [5, 'Cell line', 'HEK293-Nav1.7'],
      [6, 'Temp.', '22 °C'],
      [7, 'Operator', 'R. Okafor'],
    ]);
    expect(findKeyValue([sheetOf(ROWS), runInfo], 'PLATE BARCODE')?.value).toBe('XYZ123');
    expect(findKeyValue([sheetOf(ROWS), runInfo], 'Plate barcode', 'Data')).toBeNull();
  });

  test('the guess finds barcode-like keys on other sheets and above the header, never in the table', () => {
    const data = sheetOf([['Barcode', 'PL-0042'], [], ...ROWS.slice(1)]);
    const onData = guessFactLocators([data], 'Data', 3);
    expect(onData.facts.barcode).toEqual({ kind: 'key', sheet: 'Data', key: 'Barcode' });
    expect(onData.found).toEqual({ barcode: 'PL-0042' });

    const both = guessFactLocators([sheetOf(ROWS), runInfo], 'Data', 2);
    expect(both.found).toEqual({
      barcode: 'XYZ123',
      runDate: '2026-11-30',
      cellLine: 'HEK293-Nav1.7',
      temperature: '22 °C',
      operator: 'R. Okafor',
    });
    // A table's rows are no key/value pairs: more than three cells written.
    const table = sheetOf(
      [
        ['Plate ID', 'Well', 'Compound', 'Conc'],
        ['P1', 'A01', 'GW-0001', 1],
      ],
      'Plates',
    );
    expect(guessFactLocators([table, sheetOf(ROWS)], 'Data', 2).found).toEqual({});
  });

  test('a cell address is read, a missing fact is a warning naming where Gatewell looked', () => {
    expect(parseCellAddress('B2')).toEqual({ row: 1, column: 1 });
    expect(parseCellAddress('$AA$10')).toEqual({ row: 9, column: 26 });
    expect(parseCellAddress('B0')).toBeNull();
    const mapping = columnMappingDraftSchema.parse({
      facts: {
        barcode: { kind: 'cell', sheet: 'Run info', address: 'c4' },
        operator: { kind: 'key', sheet: 'Run info', key: 'Analyst' },
      },
    });
    expect(readPlateFacts([runInfo], mapping)).toEqual({
      facts: { barcode: '2026-11-30' },
      warnings: ['The operator was not found beside the key "Analyst" on sheet "Run info".'],
    });
  });
});

describe('header fingerprints', () => {
  test('normalised header texts, blank headers dropped', () => {
    expect(headerFingerprint(['Pos', null, 'Sample ID', 'Dose (nM)'])).toBe('pos|sampleid|dosenm');
    expect(headerFingerprint(['Well'])).toBeNull();
  });

  test('a template is matched on the sheet that shows its fingerprint at its header row', () => {
    const mapping = columnMappingDraftSchema.parse({ headerRow: 2, wellSheet: 'Data' });
    const template: TemplateSummary = {
      id: 't1',
      name: 'Rig 4',
      mapping,
      fingerprint: 'pos|sampleiddosenm',
    };
    const right = { ...template, fingerprint: headerFingerprint(HEADERS) };
    const sheets = [sheetOf([['x']], 'Run info'), sheetOf(ROWS, 'Data')];
    expect(matchTemplate([template], sheets)).toBeNull();
    expect(matchTemplate([template, right], sheets)).toEqual({ template: right, sheet: 'Data' });
    expect(matchTemplate([right], [sheetOf(ROWS.slice(1), 'Data')])).toBeNull();
  });
});
