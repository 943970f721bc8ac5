import 'server-only';
// The split step (issue 18): a file may hold several plates, a sheet per plate (each sheet its own well
// table) or one table with a plate column whose distinct values split the rows. Each plate becomes a part
// that goes through the reshape, validate and QC path unchanged, as if it were a file of its own. A
// column split keeps every row where the file has it (rows of other plates are left blank), so that
// issues still name the file's own rows.
import { headerFingerprint } from './fingerprint';
import type { ColumnMapping, FactLocator, PlateSplit } from './mapping-schema';
import { columnLetter, normaliseLabel } from './normalise-text';
import { FACT_KEYS, findKeyValue, readFact } from './plate-facts';
import { readText, shorten } from './read-cell';
import { layoutHeaderCells } from './reshape-table';
import { isSummaryRow, isUnitsRow } from './skip-rows';
import type { Cell, SheetData } from './spreadsheet-types';

/** One plate of a file: the sheet it is read from and the mapping it is read with. */
export interface PlatePart {
  /** The part's key within the file: its sheet's name (one, sheet) or its value in the plate column. */
  key: string;
  /** The label the file gives the plate (its barcode, sheet name or plate-column value); null: none. */
  label: string | null;
  labelSource: 'barcode' | 'sheet' | 'column' | null;
  /** The sheet read as this plate: the file's sheet, or, for a column split, with other plates' rows left blank. */
  sheet: SheetData;
  /** The mapping this part is read with: the file's, its plate facts looked for on the part's own sheet. */
  mapping: ColumnMapping;
}

/** Why a file cannot be split into plates as the mapping says, with what to do (a whole-file problem). */
export interface SplitProblem {
  message: string;
  whatToDo: string;
}

export type SplitResult = { ok: true; parts: PlatePart[] } | { ok: false; problems: SplitProblem[] };

/** At most this many plates in one file (a column of running numbers is not a plate column). */
export const MAX_PLATES_PER_FILE = 50;

const isBlankRow = (row: readonly Cell[] | undefined) =>
  !row || row.every((cell) => cell === null || (typeof cell === 'string' && cell.trim() === ''));

/** The 0-based index of the header `wanted` in a row (compared as normalised labels); -1 when absent. */
function headerIndex(row: readonly Cell[] | undefined, wanted: string): number {
  const key = normaliseLabel(wanted);
  return (row ?? []).findIndex((cell) => cell !== null && normaliseLabel(String(cell)) === key);
}

/** Splits the file into its plates as `mapping.plates` says, starting from the chosen sheet. */
export function splitPlates(
  sheets: readonly SheetData[],
  chosen: string,
  mapping: ColumnMapping,
): SplitResult {
  const sheet = sheets.find((s) => s.name === chosen);
  if (!sheet)
    return {
      ok: false,
      problems: [
        { message: `The file has no sheet named "${shorten(chosen)}".`, whatToDo: 'Choose a sheet.' },
      ],
    };
  if (mapping.plates.by === 'sheet') return splitBySheet(sheets, sheet, mapping);
  if (mapping.plates.by === 'column') return splitByColumn(sheet, mapping);
  return { ok: true, parts: [{ key: sheet.name, label: null, labelSource: null, sheet, mapping }] };
}

/** The headers the mapping reads from a long table's header row (normalised). */
function mappedHeaders(mapping: ColumnMapping): string[] {
  return Object.values(mapping.columns)
    .filter((h): h is string => h !== null)
    .map((h) => normaliseLabel(h));
}

/**
 * A plate per sheet: every sheet whose header row (at the mapping's row) is the chosen sheet's. A sheet
 * that shows none of the mapped headers there is not a plate (a run sheet, notes) and is left out; one
 * that shows some but not all of them is a plate sheet laid out differently, and stops the import.
 */
function splitBySheet(sheets: readonly SheetData[], chosen: SheetData, mapping: ColumnMapping): SplitResult {
  const { layout, headerRow } = mapping;
  const reference = headerFingerprint(layoutHeaderCells(chosen, layout, headerRow));
  const wanted = mappedHeaders(mapping);
  const plates: SheetData[] = [];
  const problems: SplitProblem[] = [];
  for (const sheet of sheets) {
    const cells = layoutHeaderCells(sheet, layout, headerRow);
    if (sheet === chosen || (reference !== null && headerFingerprint(cells) === reference)) {
      plates.push(sheet);
      continue;
    }
    if (layout.kind !== 'long') continue;
    const present = new Set(cells.map((c) => (c === null ? '' : normaliseLabel(String(c)))));
    const missing = Object.values(mapping.columns).filter(
      (h): h is string => h !== null && !present.has(normaliseLabel(h)),
    );
    if (missing.length === wanted.length) continue; // not a well table
    if (missing.length === 0) {
      plates.push(sheet); // the mapped columns are all there; other columns may differ
      continue;
    }
    problems.push({
      message: `Sheet "${shorten(sheet.name)}", row ${headerRow}: its header row differs from sheet "${shorten(chosen.name)}": it lacks ${missing.map((h) => `"${shorten(h)}"`).join(', ')}.`,
      whatToDo:
        'Every plate sheet needs the same header row, as one mapping reads them all: export the plates again with the same columns, or choose "one plate" and import the sheets one at a time.',
    });
  }
  if (problems.length) return { ok: false, problems };
  if (plates.length > MAX_PLATES_PER_FILE) return { ok: false, problems: [tooMany(plates.length)] };
  const located = plates.map((sheet) => {
    const partMapping = { ...mapping, wellSheet: sheet.name, facts: factsOnSheet(mapping, plates, sheet) };
    return { sheet, partMapping, barcode: barcodeOn(sheets, partMapping) };
  });
  // A barcode read alike for several plates (a run sheet the plates share) is the file's, not a plate's:
  // those plates are labelled by their sheets, so that no two plates of a file share a label.
  const seen = new Map<string, number>();
  for (const { barcode } of located) if (barcode) seen.set(barcode, (seen.get(barcode) ?? 0) + 1);
  return {
    ok: true,
    parts: located.map(({ sheet, partMapping, barcode }) => {
      const own = barcode !== null && seen.get(barcode) === 1 ? barcode : null;
      return {
        key: sheet.name,
        label: (own ?? sheet.name).slice(0, 120),
        labelSource: own ? ('barcode' as const) : ('sheet' as const),
        sheet,
        mapping: partMapping,
      };
    }),
  };
}

/** The barcode where the part's mapping locates it (beside a key, or in a fixed cell), or null. */
function barcodeOn(sheets: readonly SheetData[], mapping: ColumnMapping): string | null {
  const locator = mapping.facts.barcode;
  if (!locator) return null;
  return readFact(sheets, locator)?.trim() || null;
}

/**
 * The mapping's fact locators moved to the part's own sheet: a fact located on a plate sheet (a cell, or
 * beside a key) is read on this plate's sheet, at the same cell or beside the same key, never on another
 * plate's; a fact located by its key on any sheet is read on this plate's sheet when that sheet holds the
 * key; facts on other sheets (a run sheet shared by the plates) stay where they are.
 */
function factsOnSheet(
  mapping: ColumnMapping,
  plateSheets: readonly SheetData[],
  sheet: SheetData,
): ColumnMapping['facts'] {
  const onPlateSheet = (name: string | null) => name === null || plateSheets.some((s) => s.name === name);
  const moved = (locator: FactLocator | null): FactLocator | null => {
    if (!locator || !onPlateSheet(locator.sheet)) return locator;
    if (locator.kind === 'cell' || locator.sheet !== null) return { ...locator, sheet: sheet.name };
    return findKeyValue([sheet], locator.key) ? { ...locator, sheet: sheet.name } : locator;
  };
  return Object.fromEntries(
    Object.entries(mapping.facts).map(([fact, locator]) => [fact, moved(locator)]),
  ) as ColumnMapping['facts'];
}

function tooMany(count: number): SplitProblem {
  return {
    message: `The file would split into ${count} plates; Gatewell takes at most ${MAX_PLATES_PER_FILE} from one file.`,
    whatToDo:
      'Check that the plate column names plates (a barcode or plate number), not wells or compounds, or export the plates in several files.',
  };
}

/** The rows of a table split by the values of its plate column (rows index from the header row down). */
interface ColumnGroups {
  /** Each plate's value as first written, and its 0-based rows. */
  groups: Map<string, { value: string; rows: number[] }>;
  /** 0-based rows holding data but no plate value. */
  blank: number[];
  /** 0-based rows kept in every part: the header and the rows above it, a units row. */
  shared: Set<number>;
}

function groupRows(sheet: SheetData, mapping: ColumnMapping, column: number): ColumnGroups {
  const header = mapping.headerRow - 1;
  const shared = new Set<number>();
  for (let i = 0; i <= header; i += 1) shared.add(i);
  const unitsRow = sheet.rows[header + 1];
  if (
    unitsRow &&
    mapping.rows.unitsRow !== 'no' &&
    (mapping.rows.unitsRow === 'yes' || isUnitsRow(unitsRow)) &&
    readText(unitsRow[column]) === null
  )
    shared.add(header + 1);
  const wellIndex =
    mapping.columns.well === null ? -1 : headerIndex(sheet.rows[header], mapping.columns.well);
  const groups = new Map<string, { value: string; rows: number[] }>();
  const blank: number[] = [];
  sheet.rows.forEach((cells, index) => {
    if (shared.has(index) || isBlankRow(cells)) return;
    const value = readText(cells[column]);
    if (value === null) {
      const summary =
        mapping.rows.skipSummaryRows &&
        isSummaryRow(cells, wellIndex === -1 ? null : wellIndex, mapping.rows.summaryWords);
      if (!summary) blank.push(index);
      return;
    }
    const key = normaliseLabel(value) || value;
    const group = groups.get(key) ?? { value: value.slice(0, 120), rows: [] };
    group.rows.push(index);
    groups.set(key, group);
  });
  return { groups, blank, shared };
}

/** Plates told apart by a plate column: a part per distinct value, holding that value's rows. */
function splitByColumn(sheet: SheetData, mapping: ColumnMapping): SplitResult {
  const name = mapping.plates.column ?? '';
  if (mapping.layout.kind === 'grid')
    return {
      ok: false,
      problems: [
        {
          message: `Sheet "${shorten(sheet.name)}" is read as plate grids, which have no plate column.`,
          whatToDo: 'Choose "one plate" or "a sheet per plate" for a sheet of plate grids.',
        },
      ],
    };
  const column = headerIndex(sheet.rows[mapping.headerRow - 1], name);
  if (column === -1)
    return {
      ok: false,
      problems: [
        {
          message: `Sheet "${shorten(sheet.name)}", row ${mapping.headerRow}: no column "${shorten(name)}" names the plates.`,
          whatToDo:
            'On the mapping step, choose the column that holds each row\'s plate barcode or plate number, or choose "one plate".',
        },
      ],
    };
  const { groups, blank, shared } = groupRows(sheet, mapping, column);
  const at = `column ${columnLetter(column)} "${shorten(name)}"`;
  if (blank.length > 0) {
    const shown = blank.slice(0, 10).map((r) => r + 1);
    const more = blank.length > shown.length ? ` and ${blank.length - shown.length} more` : '';
    return {
      ok: false,
      problems: [
        {
          message: `Sheet "${shorten(sheet.name)}", ${at}: ${blank.length === 1 ? 'row' : 'rows'} ${shown.join(', ')}${more} name no plate.`,
          whatToDo:
            'Every row of a well needs its plate in the plate column: export the file again with the plate filled in, or choose "one plate" if the file holds one.',
        },
      ],
    };
  }
  if (groups.size === 0)
    return {
      ok: false,
      problems: [
        {
          message: `Sheet "${shorten(sheet.name)}", ${at}: no row below the header names a plate.`,
          whatToDo: 'Check the header row on the mapping step, or choose "one plate".',
        },
      ],
    };
  if (groups.size > MAX_PLATES_PER_FILE) return { ok: false, problems: [tooMany(groups.size)] };
  return {
    ok: true,
    parts: [...groups.values()].map(({ value, rows }) => {
      const mine = new Set(rows);
      return {
        key: value,
        label: value,
        labelSource: 'column' as const,
        sheet: {
          ...sheet,
          rows: sheet.rows.map((cells, index) => (shared.has(index) || mine.has(index) ? cells : [])),
        },
        mapping,
      };
    }),
  };
}

/** True when a header names a plate: a common name of the plate barcode, or one holding "plate" or "barcode". */
function isPlateHeader(header: string): boolean {
  const key = normaliseLabel(header);
  return FACT_KEYS.barcode.includes(key) || key.includes('barcode') || /^plate/.test(key);
}

/**
 * How many plates the sheet's file likely holds, for the guess: a sheet per plate when two or more
 * sheets show this sheet's header row; a plate column when a column headed like a plate barcode holds
 * two or more values, every data row has one, and the same well turns up under more than one of them
 * (whole plates, not a plate's halves); else one plate.
 */
export function guessPlateSplit(
  sheets: readonly SheetData[],
  sheet: SheetData,
  mapping: ColumnMapping,
): PlateSplit {
  const { layout, headerRow } = mapping;
  const own = headerFingerprint(layoutHeaderCells(sheet, layout, headerRow));
  if (own !== null) {
    const alike = sheets.filter((s) => headerFingerprint(layoutHeaderCells(s, layout, headerRow)) === own);
    if (alike.length >= 2) return { by: 'sheet', column: null };
  }
  if (layout.kind === 'grid') return { by: 'one', column: null };
  const header = sheet.rows[headerRow - 1] ?? [];
  const mapped = new Set(mappedHeaders(mapping));
  const wellIndex = mapping.columns.well === null ? -1 : headerIndex(header, mapping.columns.well);
  for (const [index, cell] of header.entries()) {
    const text = readText(cell);
    if (text === null || mapped.has(normaliseLabel(text)) || !isPlateHeader(text)) continue;
    const { groups, blank } = groupRows(sheet, mapping, index);
    if (blank.length > 0 || groups.size < 2 || groups.size > MAX_PLATES_PER_FILE) continue;
    if (wellIndex !== -1) {
      const plateOfWell = new Map<string, string>();
      let repeated = false;
      for (const [key, group] of groups) {
        for (const row of group.rows) {
          const well = readText(sheet.rows[row]?.[wellIndex]);
          if (well === null) continue;
          const first = plateOfWell.get(well.toUpperCase());
          if (first !== undefined && first !== key) repeated = true;
          else plateOfWell.set(well.toUpperCase(), key);
        }
      }
      if (!repeated) continue;
    }
    return { by: 'column', column: text };
  }
  return { by: 'one', column: null };
}
