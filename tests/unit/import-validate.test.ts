import { describe, expect, test } from 'vitest';
import { guessMapping } from '@/lib/imports/guess-mapping';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';

// Columns A–J of a small export in Gatewell's flat layout; row 1 is the header, row 2 a good well.
const HEADERS = [
  'Well',
  'Compound',
  'Conc (nM)',
  'Target',
  'I control [pA]',
  'I compound [pA]',
  'Rseal (GOhm)',
  'Rs (MOhm)',
  'Cm (pF)',
  'Role',
];
const GOOD: Cell[] = ['A01', 'GW-0001', 1000, 'Nav1.7', -2000, -1000, 1.2, 5, 15, 'test'];
const COLUMN = Object.fromEntries(HEADERS.map((header, i) => [header, i]));
const OPTIONS = { knownCompounds: ['GW-0001', 'GW-0002'], knownTargets: ['Nav1.7', 'Kv7.2'] };

const sheetOf = (rows: Cell[][]): SheetData => ({ name: 'Readouts', rows, decimalComma: false });
/** A row 3 that differs from the good row in the named columns (well B02 unless given). */
const rowWith = (changes: Record<string, Cell>): Cell[] => {
  const row: Cell[] = [...GOOD];
  row[0] = 'B02';
  for (const [header, value] of Object.entries(changes)) row[COLUMN[header]!] = value;
  return row;
};
const preview = (rows: Cell[][], plateFormat?: PlateFormat) => {
  const sheet = sheetOf(rows);
  return validatePlateSheet(sheet, guessMapping(sheet).mapping, { ...OPTIONS, plateFormat });
};

describe('row errors name sheet, row and column', () => {
  test.each<[string, Record<string, Cell>, string, string]>([
    [
      'non-numeric concentration',
      { 'Conc (nM)': 'ten' },
      'not_numeric',
      'Sheet "Readouts", row 3, column C "Conc (nM)": concentration: "ten" is not a number.',
    ],
    [
      'negative concentration',
      { 'Conc (nM)': -5 },
      'negative_value',
      'Sheet "Readouts", row 3, column C "Conc (nM)": concentration is negative (-5); it must be 0 or more.',
    ],
    [
      'negative seal resistance',
      { 'Rseal (GOhm)': '-1.2' },
      'negative_value',
      'Sheet "Readouts", row 3, column G "Rseal (GOhm)": seal resistance is negative (-1.2); it must be 0 or more.',
    ],
    [
      'negative series resistance',
      { 'Rs (MOhm)': -3 },
      'negative_value',
      'Sheet "Readouts", row 3, column H "Rs (MOhm)": series resistance is negative (-3); it must be 0 or more.',
    ],
    [
      'NaN seal resistance',
      { 'Rseal (GOhm)': 'NaN' },
      'not_finite',
      'Sheet "Readouts", row 3, column G "Rseal (GOhm)": seal resistance: "NaN" is not a finite number.',
    ],
    [
      'infinite capacitance',
      { 'Cm (pF)': 'Infinity' },
      'not_finite',
      'Sheet "Readouts", row 3, column I "Cm (pF)": capacitance: "Infinity" is not a finite number.',
    ],
    [
      'formula error in a current',
      { 'I compound [pA]': '#DIV/0!' },
      'not_numeric',
      'Sheet "Readouts", row 3, column F "I compound [pA]": compound current: "#DIV/0!" is not a number.',
    ],
    [
      'zero control current',
      { 'I control [pA]': 0 },
      'zero_control_current',
      'Sheet "Readouts", row 3, column E "I control [pA]": control current is 0; block cannot be computed without a control current.',
    ],
    [
      'zero control current as text',
      { 'I control [pA]': '0.0' },
      'zero_control_current',
      'Sheet "Readouts", row 3, column E "I control [pA]": control current is 0; block cannot be computed without a control current.',
    ],
    [
      'unknown compound',
      { Compound: 'GW-0099' },
      'unknown_compound',
      'Sheet "Readouts", row 3, column B "Compound": compound "GW-0099" is not registered; register it or correct the identifier.',
    ],
    [
      'test well without compound',
      { Compound: null },
      'missing_value',
      'Sheet "Readouts", row 3, column B "Compound": a test well needs a compound identifier; the cell is empty.',
    ],
    [
      'unknown target',
      { Target: 'Cav2.2' },
      'unknown_target',
      'Sheet "Readouts", row 3, column D "Target": target "Cav2.2" is not one of this screen\'s targets (Nav1.7, Kv7.2).',
    ],
    [
      'test well without concentration',
      { 'Conc (nM)': null },
      'missing_concentration',
      'Sheet "Readouts", row 3, column C "Conc (nM)": a test well needs a concentration; the cell is empty.',
    ],
    [
      'test well at zero concentration',
      { 'Conc (nM)': 0 },
      'missing_concentration',
      'Sheet "Readouts", row 3, column C "Conc (nM)": a test well needs a concentration above 0.',
    ],
    [
      'not a well position',
      { Well: 'Z-top' },
      'invalid_well',
      'Sheet "Readouts", row 3, column A "Well": "Z-top" is not a well position; write it as a row letter and column number, like A1 or A01.',
    ],
    [
      'empty well position',
      { Well: null },
      'missing_value',
      'Sheet "Readouts", row 3, column A "Well": the well position is empty.',
    ],
    [
      'beyond every format',
      { Well: 'A49' },
      'well_outside_format',
      'Sheet "Readouts", row 3, column A "Well": well A49 is beyond the largest plate, a 1536-well plate (rows A–AF, columns 1–48).',
    ],
    [
      'unit in the cell that does not fit',
      { 'Conc (nM)': '3 pA' },
      'unknown_unit',
      'Sheet "Readouts", row 3, column C "Conc (nM)": concentration: "3 pA" has the unit "pA", which is not one of pM, nM, µM, mM, M.',
    ],
  ])('%s', (_name, changes, code, message) => {
    const result = preview([HEADERS, GOOD, rowWith(changes)]);
    const row = result.rows.find((r) => r.row === 3)!;
    expect(row.status).toBe('error');
    expect(row.issues.map((issue) => [issue.code, issue.message])).toEqual([[code, message]]);
    expect(row.issues[0]).toMatchObject({ sheet: 'Readouts', row: 3, severity: 'error' });
    expect(result.ok).toBe(false);
    expect(result.plate?.wells.map((well) => well.position)).toEqual(['A01']);
  });

  test('a well outside the chosen format is refused', () => {
    const result = preview([HEADERS, GOOD, rowWith({ Well: 'I01' })], 96);
    expect(result.issues.map((issue) => issue.message)).toEqual([
      'Sheet "Readouts", row 3, column A "Well": well I01 is outside a 96-well plate (rows A–H, columns 1–12).',
    ]);
    expect(result.plate).toMatchObject({ format: 96, formatSource: 'chosen' });
  });

  test('a well + target given twice is refused on the later row', () => {
    const result = preview([HEADERS, GOOD, ['a1', ...GOOD.slice(1)]]);
    expect(result.issues.map((issue) => issue.message)).toEqual([
      'Sheet "Readouts", row 3, column A "Well": well A01 with target Nav1.7 is already given in row 2; each well has one row per target.',
    ]);
  });

  test('a second target of the same well is a second readout; a different compound in it is refused', () => {
    const second = ['A01', 'GW-0001', 1000, 'Kv7.2', 800, 700, 1.2, 5, 15, 'test'];
    const ok = preview([HEADERS, GOOD, second]);
    expect(ok.ok).toBe(true);
    expect(
      ok.plate?.wells[0]?.readouts.map((r) => [r.target, r.controlCurrent_pA, r.compoundCurrent_pA]),
    ).toEqual([
      ['Nav1.7', -2000, -1000],
      ['Kv7.2', 800, 700],
    ]);
    const clash = preview([HEADERS, GOOD, ['A01', 'GW-0002', 1000, 'Kv7.2', 800, 700, 1.2, 5, 15, 'test']]);
    expect(clash.issues.map((issue) => issue.message)).toEqual([
      'Sheet "Readouts", row 3, column B "Compound": well A01 holds test GW-0002 at 1 µM here but test GW-0001 at 1 µM in row 2; a well holds one compound at one concentration.',
    ]);
  });

  test('differing cell properties of one well are a warning, and the first value is kept', () => {
    const result = preview([HEADERS, GOOD, ['A01', 'GW-0001', 1000, 'Kv7.2', 800, 700, 1.5, 5, 15, 'test']]);
    expect(result.ok).toBe(true);
    expect(result.issues).toEqual([
      expect.objectContaining({
        code: 'conflicting_value',
        severity: 'warning',
        message:
          'Sheet "Readouts", row 3, column G "Rseal (GOhm)": well A01 has 1.5 GΩ here but 1.2 GΩ in row 2; Gatewell keeps the value of row 2.',
      }),
    ]);
    expect(result.plate?.wells[0]?.sealResistance_GOhm).toBe(1.2);
  });

  test('unknown compounds are listed with their rows so a chemist can register them', () => {
    const result = preview([
      HEADERS,
      GOOD,
      rowWith({ Compound: 'GW-0099' }),
      rowWith({ Well: 'B03', Compound: 'gw-0099' }),
      rowWith({ Well: 'B04', Compound: 'GW-0100' }),
    ]);
    expect(result.unknownCompounds).toEqual([
      { identifier: 'GW-0099', rows: [3] },
      { identifier: 'gw-0099', rows: [4] },
      { identifier: 'GW-0100', rows: [5] },
    ]);
    const targets = preview([HEADERS, GOOD, rowWith({ Target: 'Cav2.2' })]);
    expect(targets.unknownTargets).toEqual([{ name: 'Cav2.2', rows: [3] }]);
  });
});

describe('sheet errors', () => {
  test('an empty sheet', () => {
    const result = preview([[], [null, '  ']]);
    expect(result.issues.map((issue) => [issue.code, issue.message])).toEqual([
      ['empty_sheet', 'Sheet "Readouts": the sheet is empty.'],
    ]);
    expect(result.plate).toBeNull();
  });

  test('a header without data rows', () => {
    const result = preview([HEADERS, []]);
    expect(result.issues.map((issue) => issue.message)).toEqual([
      'Sheet "Readouts": the sheet has a header row (row 1) but no data rows below it.',
    ]);
  });

  test('a required column that the sheet lacks', () => {
    const without = HEADERS.filter((header) => header !== 'I control [pA]');
    const result = preview([without, GOOD.filter((_, i) => i !== COLUMN['I control [pA]'])]);
    expect(result.issues.map((issue) => [issue.code, issue.message])).toEqual([
      [
        'missing_column',
        'Sheet "Readouts", row 1: no column is chosen for the control current, which every plate needs.',
      ],
    ]);
    expect(result.rows).toEqual([]);
  });

  test('a saved template whose header is not in this file', () => {
    const sheet = sheetOf([HEADERS, GOOD]);
    const mapping = guessMapping(sheet).mapping;
    const renamed = sheetOf([HEADERS.map((h) => (h === 'Conc (nM)' ? 'Conc (uM)' : h)), GOOD]);
    const result = validatePlateSheet(renamed, mapping, OPTIONS);
    expect(result.issues.map((issue) => issue.message)).toEqual([
      'Sheet "Readouts", row 1: the header row has no column "Conc (nM)" (chosen for the concentration); its headers are "Well", "Compound", "Conc (uM)", "Target", "I control [pA]", "I compound [pA]", "Rseal (GOhm)", "Rs (MOhm)", "Cm (pF)", "Role".',
    ]);
  });

  test('a mapped header that appears twice', () => {
    const result = preview([
      [...HEADERS, 'Rs (MOhm)'],
      [...GOOD, 6],
    ]);
    expect(result.issues.map((issue) => issue.message)).toEqual([
      'Sheet "Readouts", row 1: the header "Rs (MOhm)" (chosen for the series resistance) appears in columns H and K; rename one so Gatewell knows which to read.',
    ]);
  });
});

describe('whole-file problems come with what to do', () => {
  const problems = (result: ReturnType<typeof preview>) =>
    result.fileProblems.map((p) => [p.code, p.message, p.whatToDo]);

  test('a good sheet has none', () => {
    expect(preview([HEADERS, GOOD]).fileProblems).toEqual([]);
  });

  test('an empty sheet', () => {
    expect(problems(preview([[], [null, '  ']]))).toEqual([
      [
        'empty_sheet',
        'Sheet "Readouts": the sheet is empty.',
        'Choose the sheet that holds the wells on the mapping step, or export the plate from the instrument again.',
      ],
    ]);
  });

  test('a header without data rows', () => {
    expect(problems(preview([HEADERS, []]))).toEqual([
      [
        'no_data_rows',
        'Sheet "Readouts": the sheet has a header row (row 1) but no data rows below it.',
        'Check the header row on the mapping step (now row 1): the wells are read from the rows below it. If the sheet really holds no wells, export the plate again.',
      ],
    ]);
  });

  test('a required column that the sheet lacks', () => {
    const without = HEADERS.filter((header) => header !== 'I control [pA]');
    const result = preview([without, GOOD.filter((_, i) => i !== COLUMN['I control [pA]'])]);
    expect(problems(result)).toEqual([
      [
        'missing_column',
        'Sheet "Readouts", row 1: no column is chosen for the control current, which every plate needs.',
        'On the mapping step, choose the column that holds the control current. If the export has no such column, set the instrument to write it: Gatewell cannot store a plate without the control current.',
      ],
    ]);
    expect(result.ok).toBe(false);
  });

  test('a saved template whose header is not in this file', () => {
    const mapping = guessMapping(sheetOf([HEADERS, GOOD])).mapping;
    const renamed = sheetOf([HEADERS.map((h) => (h === 'Conc (nM)' ? 'Conc (uM)' : h)), GOOD]);
    expect(validatePlateSheet(renamed, mapping, OPTIONS).fileProblems.map((p) => p.whatToDo)).toEqual([
      'On the mapping step, choose the column of this sheet that holds the concentration, or check the header row (now row 1).',
    ]);
  });

  test('a header row naming nothing Gatewell knows: one problem, no header row found', () => {
    expect(
      problems(
        preview([
          ['Colour', 'Shape', 'Size'],
          ['red', 'round', 3],
        ]),
      ),
    ).toEqual([
      [
        'no_header_row',
        'Sheet "Readouts", row 1: no header row found: this row names none of the columns a plate needs (well position, compound identifier, concentration, target, control current, compound current).',
        'On the mapping step, set the header row to the row that holds the column names and choose the column for each field; if the wells are on another sheet, choose that sheet.',
      ],
    ]);
  });

  test('rows that all have errors leave no well: said once, with the first error', () => {
    const result = preview([HEADERS, rowWith({ Well: 'Z-top' }), rowWith({ Well: 'nowhere' })]);
    expect(result.plate).toBeNull();
    expect(problems(result)).toEqual([
      [
        'no_wells',
        'Sheet "Readouts": no well is left for the plate: no row can be stored as a well. The first error: Sheet "Readouts", row 2, column A "Well": "Z-top" is not a well position; write it as a row letter and column number, like A1 or A01.',
        'The same error in every row usually means a column is mapped to the wrong field or read in the wrong unit: check the mapping step, then the first rows below.',
      ],
    ]);
  });

  test('optional columns left out are no whole-file problem', () => {
    const keep = ['Well', 'Compound', 'Conc (nM)', 'Target', 'I control [pA]', 'I compound [pA]'];
    const index = keep.map((h) => COLUMN[h]!);
    const result = preview([keep, index.map((i) => GOOD[i]!)]);
    expect(result.fileProblems).toEqual([]);
    expect(result.ok).toBe(true);
  });
});

describe('values and the plate', () => {
  test('missing cell properties and currents stay null without an error; QC judges them later', () => {
    const result = preview([
      HEADERS,
      GOOD,
      rowWith({ 'Rseal (GOhm)': null, 'Cm (pF)': 'NA', 'I compound [pA]': '' }),
    ]);
    expect(result.ok).toBe(true);
    expect(result.plate?.wells[1]).toMatchObject({
      position: 'B02',
      sealResistance_GOhm: null,
      capacitance_pF: null,
      seriesResistance_MOhm: 5,
    });
    expect(result.plate?.wells[1]?.readouts).toEqual([
      { target: 'Nav1.7', controlCurrent_pA: -2000, compoundCurrent_pA: null, row: 3 },
    ]);
  });

  test('roles come from the role column, else from the compound identifier', () => {
    const rows: Cell[][] = [
      HEADERS,
      ['A01', 'DMSO', null, 'Nav1.7', -2000, -1900, 1.2, 5, 15, null],
      ['A02', 'REF', 1000, 'Nav1.7', -2000, -40, 1.2, 5, 15, ''],
      ['A03', 'DMSO', null, 'Nav1.7', -2000, -1900, 1.2, 5, 15, 'vehicle'],
      ['A04', 'GW-0002', 100, 'Nav1.7', -2000, -50, 1.2, 5, 15, 'Reference'],
      ['A05', 'GW-0001', '30', 'nav 1.7', '-2,000', -500, 1.2, 5, 15, 'TEST'],
    ];
    const result = preview(rows);
    expect(result.rows.map((row) => [row.values.role, row.values.compound, row.values.target])).toEqual([
      ['vehicle', 'DMSO', 'Nav1.7'],
      ['reference', 'REF', 'Nav1.7'],
      ['vehicle', 'DMSO', 'Nav1.7'],
      ['reference', 'GW-0002', 'Nav1.7'],
      ['test', 'GW-0001', 'Nav1.7'],
    ]);
    expect(result.rows[4]?.issues.map((issue) => issue.code)).toEqual(['not_numeric']);
  });

  test('converts to canonical units and builds the plate in row-major order', () => {
    const rows: Cell[][] = [
      [
        'Position',
        'Cmpd ID',
        'Concentration',
        'Conc unit',
        'Channel',
        'Pre current (nA)',
        'Post current (nA)',
        'Seal resistance (MOhm)',
        'Rs (MOhm)',
        'Cm (pF)',
      ],
      ['B1', 'GW-0002', 3, 'mM', 'Kv7.2', 0.9, 0.45, 1500, 6.5, 21],
      ['A1', 'GW-0001', 300, 'nM', 'Kv7.2', 1.25, '0.5 nA', '2000', 7, 19],
      ['A2', 'DMSO', null, null, 'Kv7.2', 1, 0.95, 900, 5, 17],
    ];
    const result = preview(rows);
    expect(result.ok).toBe(true);
    expect(result.plate).toMatchObject({
      format: 96,
      formatSource: 'inferred',
      rows: 8,
      columns: 12,
      targets: ['Kv7.2'],
    });
    expect(result.plate?.wells).toEqual([
      {
        position: 'A01',
        rowIndex: 0,
        columnIndex: 0,
        role: 'test',
        compound: 'GW-0001',
        concentration_uM: 0.3,
        sealResistance_GOhm: 2,
        seriesResistance_MOhm: 7,
        capacitance_pF: 19,
        readouts: [{ target: 'Kv7.2', controlCurrent_pA: 1250, compoundCurrent_pA: 500, row: 3 }],
      },
      {
        position: 'A02',
        rowIndex: 0,
        columnIndex: 1,
        role: 'vehicle',
        compound: 'DMSO',
        concentration_uM: null,
        sealResistance_GOhm: 0.9,
        seriesResistance_MOhm: 5,
        capacitance_pF: 17,
        readouts: [{ target: 'Kv7.2', controlCurrent_pA: 1000, compoundCurrent_pA: 950, row: 4 }],
      },
      {
        position: 'B01',
        rowIndex: 1,
        columnIndex: 0,
        role: 'test',
        compound: 'GW-0002',
        concentration_uM: 3000,
        sealResistance_GOhm: 1.5,
        seriesResistance_MOhm: 6.5,
        capacitance_pF: 21,
        readouts: [{ target: 'Kv7.2', controlCurrent_pA: 900, compoundCurrent_pA: 450, row: 2 }],
      },
    ]);
  });

  test('one target for the whole sheet, semicolon text with decimal commas', () => {
    const sheet: SheetData = {
      name: 'k',
      decimalComma: true,
      rows: [
        ['Well', 'Compound', 'Conc (µM)', 'I control', 'I compound'],
        ['A1', 'GW-0001', '0,3', '812,5', '400,25'],
      ],
    };
    const mapping = guessMapping(sheet, { base: { fixedTarget: 'nav1.7' } }).mapping;
    const result = validatePlateSheet(sheet, mapping, OPTIONS);
    expect(result.plate?.wells[0]).toMatchObject({
      concentration_uM: 0.3,
      readouts: [{ target: 'Nav1.7', controlCurrent_pA: 812.5, compoundCurrent_pA: 400.25, row: 2 }],
    });
  });

  test('format is inferred from the highest position', () => {
    expect(preview([HEADERS, GOOD, rowWith({ Well: 'H12' })]).plate?.format).toBe(96);
    expect(preview([HEADERS, GOOD, rowWith({ Well: 'P24' })]).plate?.format).toBe(384);
    expect(preview([HEADERS, GOOD, rowWith({ Well: 'AF48' })]).plate?.format).toBe(1536);
  });
});
