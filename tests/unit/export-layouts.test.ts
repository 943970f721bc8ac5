import { describe, expect, test } from 'vitest';
import XLSX from 'xlsx';
import { LAYOUTS, layout, type FileFacts, type LayoutFile } from '../fixtures/export-layouts';
import type { GridAnchor, TableReadBack } from '../fixtures/export-layouts/layout-kit';
import {
  CONCENTRATIONS_UM,
  NOISE,
  PLATES,
  isMeasurable,
  plate,
  potencyOf,
  recordPlate,
  TARGETS,
} from '../fixtures/export-layouts/truth';

// The generator checked against its truth by reading every file back with the workbook library itself,
// not with Gatewell's importer: the wells, the bad wells' recorded values, the words, the noise.

type Value = string | number | boolean | null;

/** Gatewell's default QC limits in the units written here (lib/science/qc/qc-thresholds.ts). */
const QC = {
  sealMin_GOhm: 0.5,
  currentMin_pA: 200,
  seriesMin_MOhm: 1,
  seriesMax_MOhm: 25,
  capMin: 1,
  capMax: 100,
};
const SCALE_TO_CANONICAL = { pA: 1, nA: 1000, GOhm: 1, MOhm: 1, pF: 1 } as const;

/** The file's sheets as rows of plain values, read by the workbook library (text with its separator, raw). */
function readBack(file: LayoutFile): Record<string, Value[][]> {
  const { kind } = file.facts;
  const text = kind === 'csv' || kind === 'csv-semicolon' || kind === 'tsv';
  const book = text
    ? XLSX.read(new TextDecoder().decode(file.bytes), {
        type: 'string',
        raw: true,
        FS: kind === 'csv' ? ',' : kind === 'tsv' ? '\t' : ';',
      })
    : XLSX.read(file.bytes, { type: 'array' });
  const sheets: Record<string, Value[][]> = {};
  for (const name of book.SheetNames) {
    const rows = XLSX.utils.sheet_to_json<Value[]>(book.Sheets[name]!, {
      header: 1,
      raw: true,
      defval: null,
      blankrows: true,
    });
    // A text file has one sheet; Gatewell names it after the file, the library "Sheet1".
    sheets[text ? file.facts.plates[0]!.sheet : name] = rows;
  }
  return sheets;
}

/** A cell as a number in the file's convention (decimal comma where the file uses it); null when missing. */
function numberOf(cell: Value | undefined, facts: FileFacts): number | null {
  if (cell === null || cell === undefined || cell === '' || cell === facts.missingMarker) return null;
  if (typeof cell === 'number') return cell;
  const text = String(cell).trim();
  const value = Number(facts.decimalComma ? text.replace(',', '.') : text);
  if (!Number.isFinite(value)) throw new Error(`"${text}" is not a number in ${facts.layout}`);
  return value;
}

const isMissing = (cell: Value | undefined, facts: FileFacts) =>
  cell === null || cell === undefined || cell === '' || cell === facts.missingMarker;

/** One well's recorded QC values as the file writes them, in GΩ, MΩ, pF and pA; missing ones flagged. */
interface WellValues {
  seal: Value[];
  series: Value[];
  capacitance: Value[];
  before: Value[];
  after: Value[];
}

/** Each well of each plate, by canonical position ("B03"), with every cell the file gives it. */
function wellsOf(file: LayoutFile): Map<string, Map<string, WellValues>> {
  const { facts } = file;
  const sheets = readBack(file);
  const result = new Map<string, Map<string, WellValues>>();
  for (const plateFacts of facts.plates) {
    const rows = sheets[plateFacts.sheet];
    if (!rows) throw new Error(`${facts.layout}: no sheet ${plateFacts.sheet}`);
    const wells = new Map<string, WellValues>();
    const entry = (position: string) => {
      let values = wells.get(position);
      if (!values) {
        values = { seal: [], series: [], capacitance: [], before: [], after: [] };
        wells.set(position, values);
      }
      return values;
    };
    const { readBack: where } = facts;
    if (where.shape === 'table') {
      const header = rows[where.headerRow - 1]!.map((cell) => (cell === null ? '' : String(cell)));
      const col = (name: string) => {
        const index = header.indexOf(name);
        if (index < 0) throw new Error(`${facts.layout}: no column "${name}"`);
        return index;
      };
      const wellColumn = col(where.well);
      const plateColumn = where.plate === null ? null : col(where.plate);
      for (const row of rows.slice(where.headerRow)) {
        const name = row[wellColumn];
        if (name === null || name === undefined) continue;
        if (!isWellName(name, facts)) continue; // a unit row or summary row
        if (plateColumn !== null && row[plateColumn] !== plateFacts.label) continue;
        const values = entry(position(name, facts, plateFacts.format));
        values.seal.push(row[col(where.sealResistance)] ?? null);
        values.series.push(row[col(where.seriesResistance)] ?? null);
        values.capacitance.push(row[col(where.capacitance)] ?? null);
        for (const name of where.before) values.before.push(row[col(name)] ?? null);
        for (const name of where.after) values.after.push(row[col(name)] ?? null);
      }
    } else {
      const { blocks } = where;
      const size = { 96: [8, 12], 384: [16, 24], 1536: [32, 48] }[plateFacts.format];
      const at = (anchor: GridAnchor, r: number, c: number) =>
        rows[anchor.row - 1 + r]?.[anchor.column - 1 + c];
      for (let r = 0; r < size[0]!; r += 1)
        for (let c = 0; c < size[1]!; c += 1) {
          if (isMissing(at(blocks.before[0]!, r, c), facts)) continue; // an empty well
          const values = entry(`${rowName(r)}${String(c + 1).padStart(2, '0')}`);
          values.seal.push(at(blocks.sealResistance, r, c) ?? null);
          values.series.push(at(blocks.seriesResistance, r, c) ?? null);
          values.capacitance.push(at(blocks.capacitance, r, c) ?? null);
          for (const anchor of blocks.before) values.before.push(at(anchor, r, c) ?? null);
          for (const anchor of blocks.after) values.after.push(at(anchor, r, c) ?? null);
        }
    }
    result.set(plateFacts.label, wells);
  }
  return result;
}

const rowName = (index: number): string =>
  index < 26
    ? String.fromCharCode(65 + index)
    : `${String.fromCharCode(64 + Math.floor(index / 26))}${String.fromCharCode(65 + (index % 26))}`;

function isWellName(cell: Value, facts: FileFacts): boolean {
  if (facts.wellNames === 'index') return typeof cell === 'number' || /^\d+$/.test(String(cell));
  return /^[A-Z]{1,2}\d{1,2}$/.test(String(cell));
}

/** How each convention writes a well name: "B3", "B03", or a running index along the rows. */
const WELL_NAME = { A1: /^[A-Z]{1,2}[1-9]\d?$/, A01: /^[A-Z]{1,2}\d{2}$/, index: /^\d{1,4}$/ } as const;

/** A well name as the file writes it ("B3", "B03", or a running index) → "B03". */
function position(cell: Value, facts: FileFacts, format: 96 | 384 | 1536): string {
  const text = String(cell);
  expect(text).toMatch(WELL_NAME[facts.wellNames]);
  const columns = { 96: 12, 384: 24, 1536: 48 }[format];
  const index = Number(text) - 1;
  const match = /^([A-Z]{1,2})(\d{1,2})$/.exec(text);
  return match
    ? `${match[1]}${match[2]!.padStart(2, '0')}`
    : `${rowName(Math.floor(index / columns))}${String((index % columns) + 1).padStart(2, '0')}`;
}

/** Why a well fails Gatewell's default QC, judged from the file's cells alone; null when it passes. */
function failureIn(values: WellValues, facts: FileFacts): string | null {
  const { units } = facts;
  const all = [...values.seal, ...values.series, ...values.capacitance, ...values.before];
  if (all.some((cell) => isMissing(cell, facts)) || values.after.some((cell) => isMissing(cell, facts)))
    return 'missing_value';
  const seal = numberOf(values.seal[0], facts)! / (units.sealResistance === 'MOhm' ? 1000 : 1);
  if (seal < QC.sealMin_GOhm) return 'low_seal';
  const series = numberOf(values.series[0], facts)! * (units.seriesResistance === 'GOhm' ? 1000 : 1);
  if (series > QC.seriesMax_MOhm || series < QC.seriesMin_MOhm) return 'high_series_resistance';
  const before = values.before.map((cell) => numberOf(cell, facts)! * SCALE_TO_CANONICAL[units.current]);
  if (before.every((pA) => Math.abs(pA) < QC.currentMin_pA)) return 'small_current';
  if (before.some((pA) => Math.abs(pA) < QC.currentMin_pA)) return 'small_current on one target only';
  const capacitance = numberOf(values.capacitance[0], facts)!;
  if (capacitance < QC.capMin || capacitance > QC.capMax) return 'capacitance';
  return null;
}

/** Every string in the file's cells. */
function strings(file: LayoutFile): string[] {
  return Object.values(readBack(file)).flatMap((rows) =>
    rows.flatMap((row) => row.filter((cell): cell is string => typeof cell === 'string')),
  );
}

/** Every line of the file's sheets that holds two written cells, as [first, second]. */
function keyValueLines(file: LayoutFile): Value[][] {
  return Object.values(readBack(file)).flatMap((rows) =>
    rows.map((row) => row.filter((cell) => cell !== null && cell !== '')).filter((row) => row.length === 2),
  );
}

/** Reads a written file back and checks its wells, bad wells, barcode and words against its facts. */
function expectFactsHold(file: LayoutFile): void {
  const { facts } = file;
  const wells = wellsOf(file);
  const cells = strings(file);
  for (const plateFacts of facts.plates) {
    const found = wells.get(plateFacts.label)!;
    expect(found.size, plateFacts.label).toBe(plateFacts.wellCount);
    expect(plateFacts.wellCount).toBe(
      recordPlate(Object.values(PLATES).find((p) => p.barcode === plateFacts.label)!).wells.length,
    );
    const failures = [...found].flatMap(([well, values]) => {
      const failure = failureIn(values, facts);
      return failure === null ? [] : [{ well, failure }];
    });
    expect(failures.sort((a, b) => a.well.localeCompare(b.well))).toEqual(
      plateFacts.badWells
        .map((b) => ({ well: b.well, failure: b.kind }))
        .sort((a, b) => a.well.localeCompare(b.well)),
    );
    // The plate's barcode is in the file: in a cell, a sheet name or the file name.
    expect(
      cells.some((c) => c.includes(plateFacts.label)) ||
        plateFacts.sheet === plateFacts.label ||
        file.filename.startsWith(plateFacts.label),
      plateFacts.label,
    ).toBe(true);
    // Where the facts say so, the barcode stands beside its key on a line of its own: key, barcode.
    if (facts.barcodeKey !== undefined)
      expect(keyValueLines(file), plateFacts.label).toContainEqual([facts.barcodeKey, plateFacts.label]);
  }
  for (const word of Object.values(facts.roleWords)) expect(cells, word).toContain(word);
  for (const word of Object.values(facts.targetWords))
    expect(
      cells.some((c) => c.includes(word!)),
      word,
    ).toBe(true);
  // Three different words for the three roles.
  expect(new Set(Object.values(facts.roleWords)).size).toBe(3);
}

describe('export layouts written from the one truth', () => {
  test('there are at least eight layouts, each with its own name, file and one-line description', () => {
    expect(LAYOUTS.length).toBeGreaterThanOrEqual(8);
    expect(new Set(LAYOUTS.map((l) => l.name)).size).toBe(LAYOUTS.length);
    const files = LAYOUTS.map((l) => l.write());
    expect(new Set(files.map((f) => f.filename)).size).toBe(LAYOUTS.length);
    for (const l of LAYOUTS) expect(l.description.length, l.name).toBeGreaterThan(20);
    expect(new Set(files.map((f) => f.facts.kind))).toEqual(
      new Set(['csv', 'csv-semicolon', 'tsv', 'xlsx', 'xls', 'ods']),
    );
    expect(new Set(files.map((f) => f.facts.plates[0]!.format))).toEqual(new Set([96, 384, 1536]));
    expect(new Set(files.map((f) => f.facts.wellNames))).toEqual(new Set(['A1', 'A01', 'index']));
    expect(new Set(files.map((f) => f.facts.units.block))).toEqual(new Set([null, 'fraction', 'percent']));
    expect(new Set(files.map((f) => f.facts.units.concentration))).toEqual(new Set(['nM', 'uM', 'mM']));
    expect(new Set(files.map((f) => f.facts.units.current))).toEqual(new Set(['pA', 'nA']));
    expect(new Set(files.map((f) => f.facts.units.sealResistance))).toEqual(new Set(['GOhm', 'MOhm']));
    expect(files.some((f) => f.facts.application === 'cumulative')).toBe(true);
    expect(files.some((f) => f.facts.plates.length > 1)).toBe(true);
    // Each layout has words of its own for the roles.
    const roleWords = files.map((f) => JSON.stringify(f.facts.roleWords));
    expect(new Set(roleWords).size).toBe(files.length);
  });

  test.each(LAYOUTS.map((l) => [l.name]))(
    '%s: read back by the workbook library, its wells, bad wells and words are what its facts say',
    (name) => expectFactsHold(layout(name).write()),
  );

  test.each(
    (
      [
        ['semicolon-decimal-comma', 'p96b'],
        ['tab-text-titled', 'p96a'],
        ['xls-workbook', 'p96a'],
        ['units-row-summary', 'p96b'],
        ['percent-inhibition-index', 'p96b'],
        ['long-comma-csv', 'p1536'],
        ['ods-workbook', 'p384'],
        ['xlsx-run-1536', 'p96a'],
        ['wide-fraction-block', 'p96b'],
      ] as const
    ).map(([name, other]) => [name, other]),
  )("%s written for plate %s: the same header, that plate's wells, bad wells and name", (name, other) => {
    const own = layout(name).write();
    const file = layout(name).write({ plate: other });
    expectFactsHold(file);
    const [plateFacts] = file.facts.plates;
    expect(plateFacts!.label).toBe(PLATES[other].barcode);
    expect(plateFacts!.format).toBe(PLATES[other].format);
    expect(file.filename).not.toBe(own.filename);
    expect(file.filename).toContain(PLATES[other].barcode.slice(-4));
    // The header row, what a template recognises a layout by, is the layout's own.
    const headerOf = (f: LayoutFile) => {
      const { headerRow } = f.facts.readBack as TableReadBack;
      return readBack(f)[f.facts.plates[0]!.sheet]![headerRow - 1];
    };
    expect(headerOf(file)).toEqual(headerOf(own));
    // Asked for its own plate, a layout writes its own file, byte for byte.
    const ownPlate = Object.entries(PLATES).find(([, p]) => p.barcode === own.facts.plates[0]!.label)![0];
    expect(Buffer.compare(layout(name).write({ plate: ownPlate as never }).bytes, own.bytes)).toBe(0);
  });

  test('a layout of one concentration per well refuses a plate of cumulative application', () => {
    expect(() => layout('semicolon-decimal-comma').write({ plate: 'cumulative96' })).toThrow(RangeError);
  });

  test('cumulative application writes the whole series, ascending, as rows of one well', () => {
    const file = layout('cumulative-rows').write();
    const rows = readBack(file)[file.facts.plates[0]!.sheet]!;
    const header = rows[0]!.map(String);
    const [cell, conc, role] = ['Cell', 'Conc (µM)', 'Role'].map((h) => header.indexOf(h));
    const series = rows
      .slice(1)
      .filter((row) => row[cell!] === 'A02' && row[role!] === file.facts.roleWords.test)
      .map((row) => Number(row[conc!]));
    expect(series).toEqual([...CONCENTRATIONS_UM].reverse());
  });

  test('the same seed gives byte-identical files; another seed gives other values', () => {
    for (const l of LAYOUTS) expect(Buffer.compare(l.write().bytes, l.write().bytes), l.name).toBe(0);
    const again = recordPlate(PLATES.p96a);
    expect(again).toEqual(plate('p96a'));
    const reseeded = recordPlate({ ...PLATES.p96a, seed: PLATES.p96a.seed + 1 });
    expect(reseeded.wells.map((w) => w.sealResistance_GOhm)).not.toEqual(
      again.wells.map((w) => w.sealResistance_GOhm),
    );
  });

  test('the noise, read from the 1536-well file, is the noise the truth specifies', () => {
    const file = layout('xlsx-run-1536').write();
    const { facts } = file;
    const rows = readBack(file)[facts.plates[0]!.sheet]!;
    const header = rows[facts.readBack.shape === 'table' ? facts.readBack.headerRow - 1 : 0]!.map(String);
    const readBackTable = facts.readBack as TableReadBack;
    const col = (name: string) => header.indexOf(name);
    const [well, kind, compound, conc, target, before, after] = [
      readBackTable.well,
      'Sample kind',
      'Sample ID',
      'Conc nM',
      'Target',
      readBackTable.before[0]!,
      readBackTable.after[0]!,
    ].map(col);
    const bad = new Set(facts.plates[0]!.badWells.map((b) => b.well.replace(/^([A-Z]+)0/, '$1')));
    const data = rows.slice(readBackTable.headerRow).filter((row) => !bad.has(String(row[well!])));
    const ratio = (row: Value[]) => Number(row[after!]) / Number(row[before!]);
    const stats = (values: number[]) => {
      const mean = values.reduce((a, b) => a + b, 0) / values.length;
      const sd = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
      return { mean, sd, n: values.length };
    };
    const vehicle = stats(data.filter((row) => row[kind!] === facts.roleWords.vehicle).map(ratio));
    const reference = stats(data.filter((row) => row[kind!] === facts.roleWords.reference).map(ratio));
    // Vehicle: run-down 0.95 ± 0.02 plus a scatter of 0.025, so σ ≈ 0.032; 2 × 64 − bad wells ≈ 124 values.
    expect(vehicle.n).toBeGreaterThan(100);
    expect(Math.abs(vehicle.mean - NOISE.rundownMean)).toBeLessThan(0.01);
    const vehicleSd = Math.hypot(NOISE.rundownSd, NOISE.ratioSd);
    expect(vehicle.sd).toBeGreaterThan(vehicleSd * 0.75);
    expect(vehicle.sd).toBeLessThan(vehicleSd * 1.25);
    // Reference: 0.02 ± 0.015 of the current left (plus 8 pA of recording noise on ~2 nA).
    expect(Math.abs(reference.mean - NOISE.referenceRatio)).toBeLessThan(0.005);
    expect(reference.sd).toBeGreaterThan(NOISE.referenceSd * 0.75);
    expect(reference.sd).toBeLessThan(NOISE.referenceSd * 1.35);
    const zPrime = 1 - (3 * (vehicle.sd + reference.sd)) / Math.abs(vehicle.mean - reference.mean);
    expect(zPrime).toBeGreaterThan(0.75);
    // Test wells: the ratio follows the Hill equation times the run-down, with the specified scatter.
    const wordOf = Object.fromEntries(Object.entries(facts.targetWords).map(([t, w]) => [w, t]));
    const residuals = data
      .filter((row) => row[kind!] === facts.roleWords.test)
      .map((row) => {
        const truth = potencyOf(
          String(row[compound!]),
          wordOf[String(row[target!])] as (typeof TARGETS)[number],
        );
        const c_uM = Number(row[conc!]) / 1000;
        const block = 1 / (1 + (truth.ic50_uM / c_uM) ** truth.hillSlope);
        return ratio(row) - (1 - block) * NOISE.rundownMean;
      });
    const residual = stats(residuals);
    expect(residual.n).toBeGreaterThan(700);
    expect(Math.abs(residual.mean)).toBeLessThan(0.005);
    expect(residual.sd).toBeGreaterThan(NOISE.ratioSd * 0.9);
    expect(residual.sd).toBeLessThan(vehicleSd * 1.15);
  });

  test('every expected IC50 is a measurable truth of a compound on the plate, inside the tested range', () => {
    for (const l of LAYOUTS) {
      const { facts } = l.write();
      expect(facts.expectedIc50.length, l.name).toBeGreaterThan(0);
      for (const e of facts.expectedIc50) {
        expect(isMeasurable(e.compound, e.target), `${l.name} ${e.compound}`).toBe(true);
        expect(potencyOf(e.compound, e.target)).toEqual({ ic50_uM: e.ic50_uM, hillSlope: e.hillSlope });
        expect(e.ic50_uM).toBeGreaterThanOrEqual(Math.min(...CONCENTRATIONS_UM) * 3);
        expect(e.ic50_uM).toBeLessThanOrEqual(Math.max(...CONCENTRATIONS_UM) / 3);
      }
    }
  });
});
