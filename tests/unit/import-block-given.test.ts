import { describe, expect, test } from 'vitest';
import { blockScaleOfHeader, decideBlockScale, readBlock, type BlockResult } from '@/lib/imports/block-scale';
import { guessMapping } from '@/lib/imports/guess-mapping';
import type { BlockScale } from '@/lib/imports/import-fields';
import { columnMappingSchema, type ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { formatForWellCount, wellFromIndex } from '@/lib/imports/plate-format';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import { computeFractionalBlock, type BlockWell } from '@/lib/science/fit/block';
import { analysePlate, type AnalysisReadout, type AnalysisWell } from '@/lib/science/plate-analysis';
import { checkWells, type QcWell } from '@/lib/science/qc/qc';

describe('reading a block cell', () => {
  test.each<[Cell, BlockScale, boolean, BlockResult]>([
    [0.5, 'fraction', false, { ok: true, value: 0.5 }],
    [50, 'percent', false, { ok: true, value: 0.5 }],
    ['37.5', 'percent', false, { ok: true, value: 0.375 }],
    ['37,5', 'percent', true, { ok: true, value: 0.375 }],
    ['42 %', 'fraction', false, { ok: true, value: 0.42 }],
    [-10, 'percent', false, { ok: true, value: -0.1 }],
    [null, 'percent', false, { ok: true, value: null }],
    ['n/a', 'fraction', false, { ok: true, value: null }],
    ['NA', 'fraction', false, { ok: true, value: null }],
    ['high', 'percent', false, { ok: false, code: 'not_numeric', detail: '"high" is not a number' }],
    ['50 pA', 'percent', false, { ok: false, code: 'not_numeric', detail: '"50 pA" is not a number' }],
    [
      Infinity,
      'fraction',
      false,
      { ok: false, code: 'not_finite', detail: '"Infinity" is not a finite number' },
    ],
  ])('%j in %s (decimal comma %s)', (cell, scale, decimalComma, expected) => {
    expect(readBlock(cell, scale, decimalComma)).toEqual(expected);
  });

  test.each<[string, BlockScale | null]>([
    ['% Inhibition', 'percent'],
    ['Inhibition (%)', 'percent'],
    ['Block percent', 'percent'],
    ['Pct block', 'percent'],
    ['Fractional block', 'fraction'],
    ['Block (0-1)', 'fraction'],
    ['Block', null],
    ['Inhibition', null],
  ])('the header %j says %s', (header, expected) => {
    expect(blockScaleOfHeader(header)).toBe(expected);
  });

  test.each<[string, BlockScale | 'guess', Cell[], BlockScale]>([
    ['the mapping decides', 'fraction', [80, 95], 'fraction'],
    ['the header decides', 'guess', [0.1], 'percent'],
    ['a value beyond 2 is percent', 'guess', [0.1, 85.5], 'percent'],
    ['values within ±2 are a fraction', 'guess', [0.1, 0.95, -0.2, null], 'fraction'],
    ['a value written with %', 'guess', ['1.5%'], 'percent'],
  ])('%s', (name, chosen, cells, expected) => {
    const header = name === 'the header decides' ? 'Inhibition %' : 'Block';
    expect(decideBlockScale(chosen, header, cells, false)).toBe(expected);
  });
});

describe('running well numbers', () => {
  test.each<[number, PlateFormat, string | null]>([
    [1, 96, 'A01'],
    [12, 96, 'A12'],
    [13, 96, 'B01'],
    [96, 96, 'H12'],
    [97, 96, null],
    [25, 384, 'B01'],
    [384, 384, 'P24'],
    [1536, 1536, 'AF48'],
    [0, 96, null],
  ])('well %i of a %i-well plate is %s', (index, format, label) => {
    expect(wellFromIndex(index, format)?.label ?? null).toBe(label);
  });

  test.each<[number, PlateFormat | null]>([
    [1, 96],
    [96, 96],
    [97, 384],
    [384, 384],
    [385, 1536],
    [1537, null],
  ])('%i wells fit a %s-well plate', (count, format) => {
    expect(formatForWellCount(count)).toBe(format);
  });
});

const sheet = (rows: Cell[][]): SheetData => ({ name: 'Inhibition', rows, decimalComma: false });
const OPTIONS = { knownCompounds: ['GW-0001'], knownTargets: ['Nav1.7'] };
const HEADER: Cell[] = ['Well #', 'Control', 'Compound', 'Conc. (nM)', 'Baseline peak (nA)', '% Inhibition'];
const MAPPING: ColumnMappingInput = {
  columns: {
    well: 'Well #',
    role: 'Control',
    compound: 'Compound',
    concentration: 'Conc. (nM)',
    controlCurrent: 'Baseline peak (nA)',
    block: '% Inhibition',
  },
  units: { concentration: 'nM', controlCurrent: 'nA' },
  roleValues: { 'Low control': 'vehicle', 'High control': 'reference', Sample: 'test' },
  fixedTarget: 'Nav1.7',
};

describe('a sheet giving the block directly, wells by running number', () => {
  test('the block is read as a fraction and the wells are placed along the rows', () => {
    const preview = validatePlateSheet(
      sheet([
        HEADER,
        [1, 'Low control', null, null, 1.2, 3.5],
        [2, 'High control', null, null, 1.1, 96],
        [14, 'Sample', 'GW-0001', 300, 0.9, 48.25],
        ['100', 'Sample', 'GW-0001', 300, 0.9, null],
      ]),
      MAPPING,
      OPTIONS,
    );
    expect(preview.issues.map((i) => i.message)).toEqual([]);
    expect(preview.plate?.format).toBe(384);
    expect(preview.plate?.wells.map((w) => [w.position, w.readouts[0]!.givenBlock])).toEqual([
      ['A01', 0.035],
      ['A02', 0.96],
      ['A14', 0.4825],
      ['E04', null],
    ]);
    expect(preview.plate?.wells[2]!.readouts[0]!.compoundCurrent_pA).toBeNull();
  });

  test.each<[string, Partial<ColumnMappingInput>, Cell, PlateFormat | undefined, string]>([
    [
      'well number 0',
      {},
      0,
      undefined,
      'Sheet "Inhibition", row 2, column A "Well #": well number 0 names no well; running well numbers start at 1 (well A1).',
    ],
    [
      'a number beyond the chosen format',
      {},
      97,
      96,
      'Sheet "Inhibition", row 2, column A "Well #": well number 97 is beyond a 96-well plate (rows A–H, columns 1–12), which has 96 wells.',
    ],
    [
      'a number beyond the largest plate',
      {},
      2000,
      undefined,
      'Sheet "Inhibition", row 2, column A "Well #": well number 2000 is beyond a 1536-well plate (rows A–AF, columns 1–48), which has 1536 wells.',
    ],
    [
      'a label where the mapping says running numbers',
      { wellNames: 'index' },
      'B3',
      undefined,
      'Sheet "Inhibition", row 2, column A "Well #": "B3" is not a running well number; number the wells 1, 2, 3 … along the rows (A1 = 1), or choose well names like A1 on the mapping step.',
    ],
    [
      'a number where the mapping says labels',
      { wellNames: 'label' },
      12,
      undefined,
      'Sheet "Inhibition", row 2, column A "Well #": "12" is not a well position; write it as a row letter and column number, like A1 or A01.',
    ],
  ])('%s', (_name, extra, well, plateFormat, message) => {
    const preview = validatePlateSheet(
      sheet([HEADER, [well, 'Sample', 'GW-0001', 300, 0.9, 48]]),
      { ...MAPPING, ...extra },
      { ...OPTIONS, ...(plateFormat ? { plateFormat } : {}) },
    );
    expect(preview.issues.filter((i) => i.field === 'well').map((i) => i.message)).toEqual([message]);
  });

  test('a block that is not a number is an error of its row', () => {
    const preview = validatePlateSheet(
      sheet([HEADER, [1, 'Sample', 'GW-0001', 300, 0.9, 'high']]),
      MAPPING,
      OPTIONS,
    );
    expect(preview.issues.map((i) => i.message)).toEqual([
      'Sheet "Inhibition", row 2, column F "% Inhibition": block: "high" is not a number.',
    ]);
  });

  test('with a block column the currents need no column; without one they do', () => {
    expect(columnMappingSchema.safeParse(MAPPING).success).toBe(true);
    const withoutBlock = { ...MAPPING, columns: { ...MAPPING.columns, block: null } };
    const result = columnMappingSchema.safeParse(withoutBlock);
    expect(result.error?.issues.map((i) => i.message)).toEqual([
      'Choose the column that holds the compound current.',
    ]);
  });

  test('the guess finds the block column and its scale', () => {
    const guess = guessMapping(sheet([HEADER, [1, 'Sample', 'GW-0001', 300, 0.9, 48]]));
    expect(guess.mapping.columns.block).toBe('% Inhibition');
    expect(guess.mapping.units.block).toBe('percent');
    expect(guess.missingFields).not.toContain('compoundCurrent');
  });
});

describe('the science on a block given directly', () => {
  const well = (id: string, role: BlockWell['role'], givenBlock: number | null): BlockWell => ({
    wellId: id,
    target: 'Nav1.7',
    role,
    controlCurrent_pA: null,
    compoundCurrent_pA: null,
    givenBlock,
    excluded: false,
  });

  test('its ratio is 1 − block, corrected for run-down as currents are', () => {
    const [target] = computeFractionalBlock([
      well('v1', 'vehicle', 0.1),
      well('v2', 'vehicle', 0.1),
      well('r1', 'reference', 0.91),
      well('t1', 'test', 0.55),
      well('t2', 'test', null),
    ]);
    expect(target!.vehicleMeanRatio).toBeCloseTo(0.9, 12);
    expect(target!.wells.map((w) => w.block)).toEqual([
      expect.closeTo(0, 12),
      expect.closeTo(0, 12),
      expect.closeTo(0.9, 12),
      expect.closeTo(0.5, 12),
      null,
    ]);
  });

  const qcWell = (role: QcWell['role'], givenBlock: number | null, control: number | null = 900): QcWell => ({
    wellId: 'w',
    role,
    controlCurrent_pA: control,
    compoundCurrent_pA: null,
    givenBlock,
    sealResistance_GOhm: 1,
    seriesResistance_MOhm: 10,
    capacitance_pF: 20,
  });

  test.each<[string, QcWell, string[]]>([
    ['a block and no compound current passes', qcWell('test', 0.4), []],
    ['a missing block fails', qcWell('test', null), ['The block is missing.']],
    [
      "a vehicle well's run-down is its block",
      qcWell('vehicle', 0.3),
      ['Vehicle well ran down by 30 %, more than the limit of 20 %.'],
    ],
    [
      'the control current is still checked where given',
      qcWell('test', 0.4, 50),
      ['Control current 50 pA is smaller than the minimum amplitude of 200 pA.'],
    ],
  ])('%s', (_name, input, messages) => {
    const [result] = checkWells([input], { vehicleRundownMax_fraction: 0.2, controlCurrentMin_pA: 200 });
    expect(result!.reasons.map((r) => r.message)).toEqual(messages);
  });

  test('without any control current the control-current rule is not applied', () => {
    const wells: AnalysisWell[] = ['v', 'r', 't'].map((id) => ({
      id,
      role: id === 'v' ? 'vehicle' : id === 'r' ? 'reference' : 'test',
      compoundId: id === 't' ? 'C1' : null,
      concentration_uM: id === 't' ? 1 : null,
      sealResistance_GOhm: 1,
      seriesResistance_MOhm: 10,
      capacitance_pF: 20,
      excluded: false,
    }));
    const readouts: AnalysisReadout[] = wells.map((w, i) => ({
      id: `r${i}`,
      wellId: w.id,
      target: 'Nav1.7',
      controlCurrent_pA: null,
      compoundCurrent_pA: null,
      givenBlock: [0.05, 0.95, 0.5][i]!,
    }));
    const analysis = analysePlate(wells, readouts, { thresholds: { controlCurrentMin_pA: 200 } });
    expect(analysis.qcRulesNotApplied.map((r) => r.message)).toEqual([
      'The control current rule (at least 200 pA) was not applied: no well has a control current. The other QC rules, Z′ and the fits still run.',
    ]);
    expect(analysis.readouts.map((r) => r.qcReasons)).toEqual([[], [], []]);
    expect(analysis.readouts.every((r) => r.used)).toBe(true);
  });
});
