import { describe, expect, test } from 'vitest';
import {
  columnMappingDraftSchema,
  columnMappingSchema,
  type ColumnMappingInput,
} from '@/lib/imports/mapping-schema';
import { readPlateFacts } from '@/lib/imports/plate-facts';
import { guessPlateSplit, splitPlates } from '@/lib/imports/split-plates';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';

// Small invented plates (structure only; no science is checked here): two wells of one target each.
const HEADER = ['Well', 'Role', 'Compound', 'Conc (uM)', 'I before (pA)', 'I after (pA)'];
const wells = (tag: string): Cell[][] => [
  ['A1', 'vehicle', null, 0, -1000, -990],
  ['A2', 'test', `CPD-${tag}`, 1, -1000, -500],
];
const sheet = (name: string, rows: Cell[][]): SheetData => ({ name, rows, decimalComma: false });

const BASE: ColumnMappingInput = {
  columns: {
    well: 'Well',
    role: 'Role',
    compound: 'Compound',
    concentration: 'Conc (uM)',
    controlCurrent: 'I before (pA)',
    compoundCurrent: 'I after (pA)',
  },
  fixedTarget: 'Nav1.7',
};
const mappingWith = (plates: ColumnMappingInput['plates']) =>
  columnMappingDraftSchema.parse({ ...BASE, plates });

describe('the plates field of a mapping', () => {
  test('a mapping without it (as stored before) reads as one plate', () => {
    expect(columnMappingDraftSchema.parse(BASE).plates).toEqual({ by: 'one', column: null });
    expect(columnMappingDraftSchema.parse({ version: 1, markers: {} }).plates.by).toBe('one');
  });
});

describe('a sheet per plate', () => {
  const info = sheet('Run', [
    ['Operator', 'Someone'],
    ['Date', '2026-04-17'],
  ]);
  const a = sheet('PLATE-A', [HEADER, ...wells('A')]);
  const b = sheet('PLATE-B', [HEADER, ...wells('B')]);

  test('every sheet with the chosen sheet header is a plate, labelled by its sheet; a run sheet is left out', () => {
    const split = splitPlates([info, a, b], 'PLATE-A', mappingWith({ by: 'sheet' }));
    expect(split.ok).toBe(true);
    if (!split.ok) return;
    expect(split.parts.map((p) => [p.key, p.label, p.labelSource])).toEqual([
      ['PLATE-A', 'PLATE-A', 'sheet'],
      ['PLATE-B', 'PLATE-B', 'sheet'],
    ]);
    const compounds = split.parts.map(
      (p) =>
        validatePlateSheet(p.sheet, p.mapping, {
          knownCompounds: ['CPD-A', 'CPD-B'],
          knownTargets: ['Nav1.7'],
        }).plate?.wells.find((w) => w.role === 'test')?.compound,
    );
    expect(compounds).toEqual(['CPD-A', 'CPD-B']);
  });

  test('a barcode beside a key on each sheet labels its plate', () => {
    const withKey = (name: string, code: string) =>
      sheet(name, [['Barcode', code], [], HEADER, ...wells(code)]);
    const mapping = columnMappingDraftSchema.parse({
      ...BASE,
      headerRow: 3,
      plates: { by: 'sheet' },
      facts: { barcode: { kind: 'key', sheet: 'S1', key: 'Barcode' } },
    });
    const split = splitPlates([withKey('S1', 'BC-001'), withKey('S2', 'BC-002')], 'S1', mapping);
    expect(split.ok && split.parts.map((p) => [p.label, p.labelSource])).toEqual([
      ['BC-001', 'barcode'],
      ['BC-002', 'barcode'],
    ]);
  });

  test('a barcode and a run date in fixed cells are read on each plate sheet, not on the first one', () => {
    const withCells = (name: string, code: string, date: string) =>
      sheet(name, [['Barcode', code, null, 'Run date', date], [], HEADER, ...wells(code)]);
    const mapping = columnMappingDraftSchema.parse({
      ...BASE,
      headerRow: 3,
      plates: { by: 'sheet' },
      facts: {
        barcode: { kind: 'cell', sheet: 'Plate 1', address: 'B1' },
        runDate: { kind: 'cell', sheet: 'Plate 1', address: 'E1' },
      },
    });
    const sheets = [
      info,
      withCells('Plate 1', 'BC-101', '2026-04-17'),
      withCells('Plate 2', 'BC-102', '2026-04-18'),
    ];
    const split = splitPlates(sheets, 'Plate 1', mapping);
    expect(split.ok).toBe(true);
    if (!split.ok) return;
    expect(split.parts.map((p) => [p.key, p.label, p.labelSource])).toEqual([
      ['Plate 1', 'BC-101', 'barcode'],
      ['Plate 2', 'BC-102', 'barcode'],
    ]);
    expect(split.parts.map((p) => readPlateFacts(sheets, p.mapping))).toEqual([
      { facts: { barcode: 'BC-101', runDate: '2026-04-17' }, warnings: [] },
      { facts: { barcode: 'BC-102', runDate: '2026-04-18' }, warnings: [] },
    ]);
  });

  test("a plate sheet without the barcode is labelled by its sheet, never by another plate's barcode", () => {
    const mapping = columnMappingDraftSchema.parse({
      ...BASE,
      headerRow: 3,
      plates: { by: 'sheet' },
      facts: { barcode: { kind: 'key', sheet: 'S1', key: 'Barcode' } },
    });
    const first = sheet('S1', [['Barcode', 'BC-001'], [], HEADER, ...wells('A')]);
    const second = sheet('S2', [['Notes', 'none'], [], HEADER, ...wells('B')]);
    const split = splitPlates([first, second], 'S1', mapping);
    expect(split.ok && split.parts.map((p) => [p.label, p.labelSource])).toEqual([
      ['BC-001', 'barcode'],
      ['S2', 'sheet'],
    ]);
    // The second plate's check says where the barcode was looked for.
    expect(split.ok && readPlateFacts([first, second], split.parts[1]!.mapping).warnings).toEqual([
      'The plate barcode was not found beside the key "Barcode" on sheet "S2".',
    ]);
  });

  test('one barcode on a run sheet the plates share labels no plate: each is labelled by its sheet', () => {
    const run = sheet('Run', [['Plate ID', 'RUN-7']]);
    const mapping = columnMappingDraftSchema.parse({
      ...BASE,
      plates: { by: 'sheet' },
      facts: { barcode: { kind: 'key', sheet: 'Run', key: 'Plate ID' } },
    });
    const split = splitPlates([run, a, b], 'PLATE-A', mapping);
    expect(split.ok && split.parts.map((p) => [p.label, p.labelSource])).toEqual([
      ['PLATE-A', 'sheet'],
      ['PLATE-B', 'sheet'],
    ]);
  });

  test('a plate sheet lacking a mapped column stops the split, naming the sheet and the column', () => {
    const odd = sheet('PLATE-C', [HEADER.filter((h) => h !== 'I after (pA)'), ...wells('C')]);
    const split = splitPlates([a, odd], 'PLATE-A', mappingWith({ by: 'sheet' }));
    expect(split.ok).toBe(false);
    if (split.ok) return;
    expect(split.problems).toHaveLength(1);
    expect(split.problems[0]!.message).toContain('Sheet "PLATE-C"');
    expect(split.problems[0]!.message).toContain('"I after (pA)"');
  });

  test('the guess proposes a sheet per plate when two sheets share the header, one plate otherwise', () => {
    const mapping = mappingWith(undefined);
    expect(guessPlateSplit([info, a, b], a, mapping)).toEqual({ by: 'sheet', column: null });
    expect(guessPlateSplit([info, a], a, mapping)).toEqual({ by: 'one', column: null });
  });
});

describe('a plate column', () => {
  const header = ['Plate', ...HEADER];
  const table = sheet('Batch', [
    header,
    ...wells('A').map((r) => ['P-1', ...r]),
    ...wells('B').map((r) => ['P-2', ...r]),
  ]);

  test('each distinct value is a plate holding its own rows, kept at the rows the file has them', () => {
    const split = splitPlates([table], 'Batch', mappingWith({ by: 'column', column: 'Plate' }));
    expect(split.ok).toBe(true);
    if (!split.ok) return;
    expect(split.parts.map((p) => [p.key, p.label, p.labelSource])).toEqual([
      ['P-1', 'P-1', 'column'],
      ['P-2', 'P-2', 'column'],
    ]);
    const second = validatePlateSheet(split.parts[1]!.sheet, split.parts[1]!.mapping, {
      knownCompounds: ['CPD-A', 'CPD-B'],
      knownTargets: ['Nav1.7'],
    });
    expect(second.ok).toBe(true);
    expect(second.plate?.wells.map((w) => w.position)).toEqual(['A01', 'A02']);
    // The readouts name the file's own rows 4 and 5 (1-based), not a renumbered table's.
    expect(second.rows.map((r) => r.row)).toEqual([4, 5]);
  });

  test('a row with data but a blank plate value stops the split, naming its row and the column', () => {
    const blank = sheet('Batch', [...table.rows, [null, 'A3', 'test', 'CPD-A', 1, -1000, -400]]);
    const split = splitPlates([blank], 'Batch', mappingWith({ by: 'column', column: 'Plate' }));
    expect(split.ok).toBe(false);
    if (split.ok) return;
    expect(split.problems[0]!.message).toBe('Sheet "Batch", column A "Plate": row 6 name no plate.');
  });

  test('a plate column the header row does not hold is told so', () => {
    const split = splitPlates([table], 'Batch', mappingWith({ by: 'column', column: 'Barcode' }));
    expect(split.ok).toBe(false);
    if (split.ok) return;
    expect(split.problems[0]!.message).toContain('no column "Barcode"');
  });

  test('a complete mapping needs the plate column named', () => {
    const result = columnMappingDraftSchema.safeParse({ ...BASE, plates: { by: 'column' } });
    expect(result.success).toBe(true);
    const complete = columnMappingSchema.safeParse({ ...BASE, plates: { by: 'column' } });
    expect(complete.success).toBe(false);
    expect(complete.error?.issues.map((i) => i.path.join('.'))).toContain('plates.column');
  });

  test('the guess proposes the plate column when whole plates repeat wells under its values', () => {
    expect(guessPlateSplit([table], table, mappingWith(undefined))).toEqual({
      by: 'column',
      column: 'Plate',
    });
    // One value only (a file of one plate that writes its barcode in every row): one plate.
    const single = sheet('Batch', [header, ...wells('A').map((r) => ['P-1', ...r])]);
    expect(guessPlateSplit([single], single, mappingWith(undefined)).by).toBe('one');
    // Halves of one plate under two values (no well repeats): not a plate column.
    const halves = sheet('Batch', [header, ['P-1', ...wells('A')[0]!], ['P-2', ...wells('A')[1]!]]);
    expect(guessPlateSplit([halves], halves, mappingWith(undefined)).by).toBe('one');
    // A blank value among them: not proposed.
    const gap = sheet('Batch', [...table.rows, [null, 'A3', 'test', 'CPD-A', 1, -1000, -400]]);
    expect(guessPlateSplit([gap], gap, mappingWith(undefined)).by).toBe('one');
  });
});
