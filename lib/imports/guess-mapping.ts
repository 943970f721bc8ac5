import 'server-only';
import { HEADER_RULES } from './header-words';
import { splitHeaderUnit } from './header-unit';
import {
  fieldNeeded,
  IMPORT_FIELDS,
  REQUIRED_FIELDS,
  UNIT_FIELDS,
  USE_DEPENDENT_FIELD,
  type ImportField,
  type UnitField,
} from './import-fields';
import {
  columnMappingDraftSchema,
  type ColumnMapping,
  type ColumnMappingInput,
  type SheetLayout,
} from './mapping-schema';
import { keyValuePairs } from './plate-facts';
import { findGridBlocks, findWideTargets, reshapeSheet } from './reshape-table';
import { columnLetter, normaliseLabel } from './normalise-text';
import { blockScaleOfHeader } from './block-scale';
import { readText } from './read-cell';
import { readoutOfHeader } from './readout-words';
import { isUnitsRow } from './skip-rows';
import type { Cell, SheetData } from './spreadsheet-types';
import { parseUnit, type QuantityKind, type Unit } from './units';

/** A column Gatewell matched to a field, with the unit its header names (null when it names none). */
export interface GuessedColumn {
  field: ImportField;
  letter: string;
  header: string;
  unit: Unit | null;
  /** 2 for a whole-header match, 1 for a looser one. */
  score: number;
}

/** A proposed mapping for the person to confirm, with what matched and what did not. */
export interface MappingGuess {
  mapping: ColumnMapping;
  matched: GuessedColumn[];
  unmatchedHeaders: { letter: string; header: string }[];
  missingFields: ImportField[];
}

/** The quantity each unit field measures. */
export const UNIT_KIND: Record<UnitField, QuantityKind> = {
  concentration: 'concentration',
  controlCurrent: 'current',
  compoundCurrent: 'current',
  useDependentControlCurrent: 'current',
  useDependentCompoundCurrent: 'current',
  sealResistance: 'sealResistance',
  seriesResistance: 'seriesResistance',
  capacitance: 'capacitance',
};

const HEADER_SEARCH_ROWS = 30;
/** Rows holding NaN from which the guess reads NaN as the file's missing marker. */
const NAN_ROWS = 3;

/**
 * Guesses which header row and columns hold which fields, and the units written in the headers.
 * `headerRow` (1-based) skips the search; `base` supplies markers, a fixed target or other settings.
 */
export function guessMapping(
  sheet: SheetData,
  options: { headerRow?: number; base?: ColumnMappingInput; layout?: SheetLayout['kind'] } = {},
): MappingGuess {
  const given = options.base?.layout ? columnMappingDraftSchema.parse(options.base) : null;
  const layout = given
    ? { layout: given.layout, headerRow: options.headerRow ?? given.headerRow }
    : guessLayout(sheet, options.headerRow, options.layout);
  if (layout.layout.kind === 'long') return guessTable(sheet, options.headerRow ?? layout.headerRow, options);
  // A wide or grid sheet: the columns are guessed on the long table read from it (reshape-table.ts).
  const headerRow = options.headerRow ?? layout.headerRow;
  const reshaped = reshapeSheet(sheet, {
    layout: layout.layout,
    headerRow,
    rows: columnMappingDraftSchema.parse(options.base ?? {}).rows,
  });
  if (!reshaped?.ok) return guessTable(sheet, headerRow, options);
  const guess = guessTable(reshaped.table.sheet, 1, options);
  guess.mapping = { ...guess.mapping, headerRow, layout: layout.layout };
  return guess;
}

/** The layouts a sheet can be read in, the one guessed first: grids, else wide target blocks, else long. */
export function guessLayouts(sheet: SheetData): { layout: SheetLayout; headerRow: number }[] {
  const found: { layout: SheetLayout; headerRow: number }[] = [];
  const { blocks } = findGridBlocks(sheet);
  if (blocks.length >= 2) {
    const headerRow = blocks[0]!.titleRow + 1;
    // Key/value lines above the grids whose key names a field ("Target") become columns of every well.
    const constants = keyValuePairs(sheet, headerRow - 1)
      .filter((pair) => matchHeaders([pair.key]).length > 0)
      .map((pair) => pair.key);
    found.push({ layout: { kind: 'grid', constants }, headerRow });
  }
  const headerRow = findHeaderRow(sheet.rows);
  // A target prefix names no field itself ("Compound current" is not the block of a target "Compound").
  const targets = findWideTargets(
    sheet.rows[headerRow - 1] ?? [],
    (rest) => matchHeaders([rest]).some((c) => (PER_TARGET_FIELDS as readonly string[]).includes(c.field)),
    (prefix) => matchHeaders([prefix]).length === 0,
  );
  if (targets.length > 0) found.push({ layout: { kind: 'wide', targets }, headerRow });
  found.push({ layout: { kind: 'long' }, headerRow });
  return found;
}

/** The fields a wide sheet's column block gives once per target. */
const PER_TARGET_FIELDS = [
  'controlCurrent',
  'compoundCurrent',
  'block',
  'useDependentControlCurrent',
  'useDependentCompoundCurrent',
  'useDependentBlock',
] as const;

function guessLayout(
  sheet: SheetData,
  headerRow: number | undefined,
  kind: SheetLayout['kind'] | undefined,
): { layout: SheetLayout; headerRow: number } {
  if (headerRow !== undefined && kind === undefined) return { layout: { kind: 'long' }, headerRow };
  const layouts = guessLayouts(sheet);
  return layouts.find((l) => kind === undefined || l.layout.kind === kind) ?? layouts.at(-1)!;
}

/** Guesses the columns of a long table whose header is row `headerRow`. */
function guessTable(
  sheet: SheetData,
  headerRow: number,
  options: { base?: ColumnMappingInput },
): MappingGuess {
  const headers = sheet.rows[headerRow - 1] ?? [];
  const matched = matchHeaders(headers);
  const columns: Partial<Record<ImportField, string>> = {};
  const units: Partial<Record<UnitField, Unit>> = {};
  // A row of units right under the header gives the unit of a column whose header names none.
  const unitsRow = sheet.rows[headerRow];
  const rowUnits = unitsRow && isUnitsRow(unitsRow) ? unitsRow : null;
  for (const column of matched) {
    columns[column.field] = column.header;
    if (!(UNIT_FIELDS as readonly string[]).includes(column.field)) continue;
    const field = column.field as UnitField;
    // Not readText: "nA" is a unit here, not the missing marker "NA".
    const cell = rowUnits?.[columnIndex(column.letter)];
    const below = typeof cell === 'string' ? cell : null;
    const unit = column.unit ?? (below ? parseUnit(below, UNIT_KIND[field]) : null);
    if (unit) units[field] = unit;
  }
  const blockHeader = matched.find((column) => column.field === 'block')?.header;
  const blockScale = blockHeader === undefined ? null : blockScaleOfHeader(blockHeader);
  const base = options.base ?? {};
  // NaN in cells of several rows is the file's way of writing a missing value, not a one-off fault.
  const nanRows = sheet.rows
    .slice(headerRow)
    .filter((cells) => cells.some((cell) => typeof cell === 'string' && cell.trim().toLowerCase() === 'nan'));
  const missing = nanRows.length >= NAN_ROWS ? { ...base.missing, notANumber: true } : base.missing;
  const mapping = columnMappingDraftSchema.parse({
    ...base,
    headerRow,
    columns: { ...base.columns, ...columns },
    units: { ...base.units, ...units, ...(blockScale ? { block: blockScale } : {}) },
    ...(missing ? { missing } : {}),
  });
  const used = new Set(matched.map((column) => column.letter));
  const unmatchedHeaders = headerCells(headers)
    .filter((cell) => !used.has(cell.letter))
    .map(({ letter, header }) => ({ letter, header }));
  const missingFields = REQUIRED_FIELDS.filter(
    (field) => mapping.columns[field] === null && fieldNeeded(field, mapping),
  );
  return { mapping, matched, unmatchedHeaders, missingFields };
}

/** The 1-based row, among the first rows, whose cells match the most fields; 1 when none match. */
export function findHeaderRow(rows: Cell[][]): number {
  let best = 1;
  let bestScore = 0;
  rows.slice(0, HEADER_SEARCH_ROWS).forEach((row, index) => {
    const score = matchHeaders(row).reduce((sum, column) => sum + column.score, 0);
    if (score > bestScore) {
      best = index + 1;
      bestScore = score;
    }
  });
  return best;
}

function matchHeaders(row: Cell[]): GuessedColumn[] {
  const candidates: (GuessedColumn & { index: number })[] = [];
  for (const { index, letter, header } of headerCells(row)) {
    const { name, unitText } = splitHeaderUnit(header);
    // A header naming a readout ("P10 block", "Tonic I compound") is read without its readout words; one
    // of nothing else ("Use-dependent") holds that readout's block.
    // A header whose other words name no current or block is read whole ("Last compound" is a compound).
    const said = readoutOfHeader(name);
    const scoreOf = (field: ImportField, names: string[]) => {
      const rule = HEADER_RULES[field];
      return names.some((n) => rule.exact.includes(n)) ? 2 : rule.loose(names[0] ?? '') ? 1 : 0;
    };
    const readoutFields =
      said.readout === null
        ? []
        : IMPORT_FIELDS.filter(isReadoutField).flatMap((field) => {
            const score = scoreOf(field, [readoutMeasure(said.rest)]);
            return score === 0
              ? []
              : [{ field: said.readout === 'use_dependent' ? USE_DEPENDENT_FIELD[field] : field, score }];
          });
    const fields =
      readoutFields.length > 0
        ? readoutFields
        : IMPORT_FIELDS.flatMap((field) => {
            const score = scoreOf(field, [normaliseLabel(name), normaliseLabel(header)]);
            return score === 0 ? [] : [{ field, score }];
          });
    for (const { field, score } of fields) {
      const kind = (UNIT_KIND as Partial<Record<ImportField, QuantityKind>>)[field];
      const unit = kind && unitText ? parseUnit(unitText, kind) : null;
      candidates.push({ field, letter, header, unit, score, index });
    }
  }
  candidates.sort(
    (a, b) =>
      b.score - a.score ||
      IMPORT_FIELDS.indexOf(a.field) - IMPORT_FIELDS.indexOf(b.field) ||
      a.index - b.index,
  );
  const taken = new Set<number>();
  const done = new Set<ImportField>();
  const chosen: (GuessedColumn & { index: number })[] = [];
  for (const candidate of candidates) {
    if (taken.has(candidate.index) || done.has(candidate.field)) continue;
    taken.add(candidate.index);
    done.add(candidate.field);
    chosen.push(candidate);
  }
  return chosen.sort((a, b) => a.index - b.index).map(({ index: _index, ...column }) => column);
}

/** A readout header's other words as a field spelling: nothing is its block, a bare current its current under compound. */
function readoutMeasure(rest: string): string {
  const plain = normaliseLabel(rest);
  if (plain === '') return 'block';
  return ['i', 'current', 'peak', 'ipeak', 'peakcurrent', 'amplitude'].includes(plain) ? 'icompound' : plain;
}

const isReadoutField = (field: ImportField): field is keyof typeof USE_DEPENDENT_FIELD =>
  field === 'controlCurrent' || field === 'compoundCurrent' || field === 'block';

function headerCells(row: Cell[]): { index: number; letter: string; header: string }[] {
  return row.flatMap((cell, index) => {
    const header = typeof cell === 'string' ? cell.trim() : readText(cell);
    return header ? [{ index, letter: columnLetter(index), header }] : [];
  });
}

const DISTINCT_LIMIT = 200;

/**
 * The distinct text values of each column below the header row, by 0-based column index, in the order
 * first written (for the value maps of the role, target and compound columns). A column with more than
 * 200 distinct values is left out.
 */
export function distinctColumnValues(sheet: SheetData, headerRow: number): Record<number, string[]> {
  const seen = new Map<number, { values: Map<string, string>; over: boolean }>();
  for (const cells of sheet.rows.slice(headerRow)) {
    cells.forEach((cell, index) => {
      const text = typeof cell === 'string' ? cell.trim() : cell === null ? '' : String(cell);
      if (text === '') return;
      const column = seen.get(index) ?? { values: new Map<string, string>(), over: false };
      seen.set(index, column);
      if (column.over) return;
      const key = text.toLowerCase().replace(/\s+/g, '');
      if (!column.values.has(key)) column.values.set(key, text);
      if (column.values.size > DISTINCT_LIMIT) column.over = true;
    });
  }
  const result: Record<number, string[]> = {};
  for (const [index, column] of seen) {
    if (column.over) continue;
    result[index] = [...column.values.values()];
  }
  return result;
}

/** The 0-based index of a column letter: A → 0, AA → 26. */
function columnIndex(letter: string): number {
  return [...letter].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;
}

/** The table the mapping step maps: its headers, first rows and each column's distinct values. */
export interface TableView {
  headers: string[];
  sample: Cell[][];
  values: Record<number, string[]>;
}

/** A way to read a sheet (long, wide or grid), with its guessed mapping and the table it gives. */
export interface LayoutView extends TableView {
  mapping: ColumnMapping;
}

/**
 * The table a mapping reads from a sheet: the sheet itself below its header row, or the long table read
 * from a wide or grid sheet (reshape-table.ts), whose headers the mapping step offers.
 */
export function tableView(
  sheet: SheetData,
  mapping: Pick<ColumnMapping, 'layout' | 'headerRow' | 'rows'>,
): TableView {
  const reshaped = reshapeSheet(sheet, mapping);
  const table = reshaped?.ok ? reshaped.table.sheet : sheet;
  const headerRow = reshaped?.ok ? 1 : mapping.headerRow;
  return {
    headers: (table.rows[headerRow - 1] ?? []).map((cell) => (cell === null ? '' : String(cell))),
    sample: table.rows.slice(headerRow, headerRow + 5),
    values: distinctColumnValues(table, headerRow),
  };
}

/** Every layout the sheet can be read in, the guessed one first, each with its mapping and table. */
export function layoutViews(sheet: SheetData): LayoutView[] {
  return guessLayouts(sheet).map(({ layout }) => {
    const { mapping } = guessMapping(sheet, { layout: layout.kind });
    return { mapping, ...tableView(sheet, mapping) };
  });
}
