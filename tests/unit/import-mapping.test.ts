import { describe, expect, test } from 'vitest';
import { findHeaderRow, guessMapping } from '@/lib/imports/guess-mapping';
import { splitHeaderUnit } from '@/lib/imports/header-unit';
import type { ImportField } from '@/lib/imports/import-fields';
import {
  columnMappingDraftSchema,
  columnMappingSchema,
  importTemplateSchema,
} from '@/lib/imports/mapping-schema';
import type { SheetData } from '@/lib/imports/spreadsheet-types';
import type { Unit } from '@/lib/imports/units';
import { layOutExport } from '@/scripts/demo-plates/export-layouts';
import { PLATE_PLANS } from '@/scripts/demo-plates/plate-plans';
import { simulatePlate } from '@/scripts/demo-plates/simulate-plate';

const sheetOf = (rows: SheetData['rows']): SheetData => ({ name: 'Readouts', rows, decimalComma: false });

describe('header guessing', () => {
  test.each<[string, ImportField, Unit | null]>([
    ['Well', 'well', null],
    ['Position', 'well', null],
    ['well_id', 'well', null],
    ['Compound ID', 'compound', null],
    ['Cmpd', 'compound', null],
    ['Conc (nM)', 'concentration', 'nM'],
    ['conc_uM', 'concentration', 'uM'],
    ['Concentration [µM]', 'concentration', 'uM'],
    ['Final conc in mM', 'concentration', 'mM'],
    ['Conc. unit', 'concentrationUnit', null],
    ['Channel', 'target', null],
    ['I control [pA]', 'controlCurrent', 'pA'],
    ['I_pre (nA)', 'controlCurrent', 'nA'],
    ['Peak current control / nA', 'controlCurrent', 'nA'],
    ['I compound [pA]', 'compoundCurrent', 'pA'],
    ['Post current (nA)', 'compoundCurrent', 'nA'],
    ['Rseal (GOhm)', 'sealResistance', 'GOhm'],
    ['Seal resistance (MΩ)', 'sealResistance', 'MOhm'],
    ['R series (MOhm)', 'seriesResistance', 'MOhm'],
    ['Rs', 'seriesResistance', null],
    ['Cm (pF)', 'capacitance', 'pF'],
    ['Cell capacitance', 'capacitance', null],
    ['Well type', 'role', null],
    ['ROLE', 'role', null],
  ])('%j is the %s column (unit %s)', (header, field, unit) => {
    const guess = guessMapping(sheetOf([[header]]), { headerRow: 1 });
    expect(guess.matched).toEqual([expect.objectContaining({ field, header, unit, letter: 'A' })]);
  });

  test('splits units off headers', () => {
    expect(splitHeaderUnit('Rseal (GOhm)')).toEqual({ name: 'Rseal', unitText: 'GOhm' });
    expect(splitHeaderUnit('Cmpd ID')).toEqual({ name: 'Cmpd ID', unitText: null });
    expect(splitHeaderUnit('Conc nM')).toEqual({ name: 'Conc', unitText: 'nM' });
  });

  test('finds the header row below title rows and keeps unmatched headers for the person', () => {
    const rows = [
      ['Run 7 export'],
      [],
      ['Well', 'Compound', 'Conc (nM)', 'Operator notes'],
      ['A01', 'GW-0001', 10, 'ok'],
    ];
    expect(findHeaderRow(rows)).toBe(3);
    const guess = guessMapping(sheetOf(rows));
    expect(guess.mapping.headerRow).toBe(3);
    expect(guess.unmatchedHeaders).toEqual([{ letter: 'D', header: 'Operator notes' }]);
    expect(guess.missingFields).toEqual(['target', 'controlCurrent', 'compoundCurrent']);
  });

  test('a base mapping supplies a fixed target and value maps', () => {
    const guess = guessMapping(sheetOf([['Well', 'Compound', 'Conc', 'I control', 'I compound']]), {
      base: { fixedTarget: 'Nav1.7', roleValues: { BUFFER: 'vehicle' }, controls: { positive: ['TTX'] } },
    });
    expect(guess.missingFields).toEqual([]);
    expect(guess.mapping.roleValues).toEqual({ BUFFER: 'vehicle' });
    expect(guess.mapping.controls).toEqual({ negative: [], positive: ['TTX'], zeroConcentration: false });
  });

  // The generated demo exports are the real test of guessing: three layouts, units in headers or in a column.
  test.each(PLATE_PLANS.map((plan) => [plan.file, plan] as const))(
    'guesses every field of %s',
    (_file, plan) => {
      const exported = layOutExport(plan, simulatePlate(plan));
      const sheet = exported.sheets.find((s) => s.name === exported.dataSheet)!;
      const guess = guessMapping({ ...sheet, decimalComma: false });
      expect(guess.mapping.headerRow).toBe(exported.headerRow);
      expect(guess.missingFields).toEqual([]);
      expect(guess.unmatchedHeaders).toEqual([]);
      expect(columnMappingSchema.safeParse(guess.mapping).success).toBe(true);
    },
  );

  test('units of the demo layouts come from their headers', () => {
    const units = PLATE_PLANS.slice(0, 3).map((plan) => {
      const exported = layOutExport(plan, simulatePlate(plan));
      return guessMapping({
        ...exported.sheets.find((s) => s.name === exported.dataSheet)!,
        decimalComma: false,
      }).mapping.units;
    });
    expect(units[0]).toEqual({
      concentration: 'nM',
      controlCurrent: 'pA',
      compoundCurrent: 'pA',
      sealResistance: 'GOhm',
      seriesResistance: 'MOhm',
      capacitance: 'pF',
      block: 'guess',
    });
    expect(units[1]).toEqual({
      concentration: 'uM',
      controlCurrent: 'nA',
      compoundCurrent: 'nA',
      sealResistance: 'MOhm',
      seriesResistance: 'MOhm',
      capacitance: 'pF',
      block: 'guess',
    });
    expect(units[2]).toEqual({
      concentration: 'uM',
      controlCurrent: 'pA',
      compoundCurrent: 'pA',
      sealResistance: 'GOhm',
      seriesResistance: 'MOhm',
      capacitance: 'pF',
      block: 'guess',
    });
  });
});

describe('mapping schema', () => {
  const complete = {
    columns: {
      well: 'Well',
      compound: 'Compound',
      concentration: 'Conc (nM)',
      target: 'Target',
      controlCurrent: 'I control',
      compoundCurrent: 'I compound',
    },
    units: { concentration: 'nM' },
  };

  test('defaults fill an empty draft and the mapping survives a JSON round trip', () => {
    const mapping = columnMappingDraftSchema.parse(complete);
    expect(mapping.units).toEqual({
      concentration: 'nM',
      controlCurrent: 'pA',
      compoundCurrent: 'pA',
      sealResistance: 'GOhm',
      seriesResistance: 'MOhm',
      capacitance: 'pF',
      block: 'guess',
    });
    expect(mapping.version).toBe(2);
    expect(mapping.roleValues).toEqual({});
    expect(mapping.targetValues).toEqual({});
    expect(mapping.facts).toEqual({
      barcode: null,
      runDate: null,
      cellLine: null,
      temperature: null,
      operator: null,
    });
    expect(columnMappingSchema.parse(JSON.parse(JSON.stringify(mapping)))).toEqual(mapping);
  });

  test.each<[string, object, Record<string, string[]>]>([
    [
      'no well column',
      { ...complete, columns: { ...complete.columns, well: null } },
      { 'columns.well': ['Choose the column that holds the well position.'] },
    ],
    [
      'no target at all',
      { ...complete, columns: { ...complete.columns, target: null } },
      {
        'columns.target': [
          'Choose the column that holds the target, or name one target for the whole sheet.',
        ],
      },
    ],
    [
      'a target column and a fixed target',
      { ...complete, fixedTarget: 'Nav1.7' },
      { fixedTarget: ['Choose a target column or one target for the whole sheet, not both.'] },
    ],
    [
      'one column for two fields',
      { ...complete, columns: { ...complete.columns, role: 'compound' } },
      { 'columns.role': ['Column "compound" is chosen for both the compound identifier and the well role.'] },
    ],
  ])('%s', (_name, input, expected) => {
    const result = columnMappingSchema.safeParse(input);
    expect(result.success).toBe(false);
    const byPath: Record<string, string[]> = {};
    for (const issue of result.error!.issues) (byPath[issue.path.join('.')] ??= []).push(issue.message);
    expect(byPath).toEqual(expected);
  });

  test('unknown units are refused', () => {
    expect(columnMappingDraftSchema.safeParse({ units: { concentration: 'ng/mL' } }).success).toBe(false);
  });

  test('a template needs a name and a complete mapping', () => {
    expect(importTemplateSchema.parse({ name: ' Rig A export ', mapping: complete }).name).toBe(
      'Rig A export',
    );
    const result = importTemplateSchema.safeParse({ name: '', mapping: complete });
    expect(result.error?.issues.map((issue) => issue.message)).toEqual(['Give the template a name.']);
  });
});
