import 'server-only';
// Plate facts a file gives outside its table: the plate barcode, and optionally the run date, cell line,
// temperature and operator, in a named cell or beside a key ("Plate barcode: XYZ123", "Barcode | XYZ123").
import { PLATE_FACTS, PLATE_FACT_LABEL, type PlateFact } from './import-fields';
import type { ColumnMapping, FactLocator } from './mapping-schema';
import { normaliseLabel } from './normalise-text';
import { readText, shorten } from './read-cell';
import type { Cell, SheetData } from './spreadsheet-types';

/** The facts read from a file, by name; only those found. */
export type PlateFacts = Partial<Record<PlateFact, string>>;

/** Keys (normalised) that name each fact; the first that a file uses is guessed. */
export const FACT_KEYS: Record<PlateFact, readonly string[]> = {
  barcode: [
    'barcode',
    'platebarcode',
    'plateid',
    'platename',
    'platelabel',
    'barcodeid',
    'platecode',
    'plate',
  ],
  runDate: ['rundate', 'date', 'experimentdate', 'recordingdate', 'acquisitiondate', 'runstart', 'started'],
  cellLine: ['cellline', 'cells', 'celltype', 'line'],
  temperature: ['temperature', 'temp', 'recordingtemperature', 'bathtemperature'],
  operator: ['operator', 'user', 'experimenter', 'runby', 'scientist', 'username', 'operatorname'],
};

const FACT_MAX_LENGTH = 200;
const SEARCH_ROWS = 200;
const SEARCH_COLUMNS = 30;

/** A key and its value found in a row: the key as written and the value's text. */
export interface KeyValue {
  sheet: string;
  row: number;
  key: string;
  value: string;
}

const cellText = (cell: Cell | undefined): string | null => {
  const text = readText(cell);
  return text === null ? null : text.slice(0, FACT_MAX_LENGTH);
};

/**
 * Every key/value pair in a sheet's rows: a row whose first written cell is the key, its value either
 * after a colon in the same cell ("Plate barcode: XYZ123") or in the next written cell of the row.
 * A row of more than three written cells is a table's, not a pair. `rows` limits the search to the
 * first rows (a well sheet's rows above its header).
 */
export function keyValuePairs(sheet: SheetData, rows = SEARCH_ROWS): KeyValue[] {
  const pairs: KeyValue[] = [];
  sheet.rows.slice(0, rows).forEach((cells, index) => {
    const written = cells
      .slice(0, SEARCH_COLUMNS)
      .map((cell) => cellText(cell))
      .flatMap((text, column) => (text === null ? [] : [{ text, column }]));
    const first = written[0];
    if (!first || written.length > 3) return;
    const colon = /^([^:]{1,100}?)\s*[:=]\s*(.*)$/.exec(first.text);
    if (colon && colon[2]!.trim() !== '') {
      pairs.push({ sheet: sheet.name, row: index + 1, key: colon[1]!.trim(), value: colon[2]!.trim() });
      return;
    }
    const second = written[1];
    if (second) {
      const key = first.text.replace(/\s*[:=]\s*$/, '');
      pairs.push({ sheet: sheet.name, row: index + 1, key, value: second.text });
    }
  });
  return pairs;
}

/** The value beside `key` (compared as normalised labels) in the named sheet, or in any sheet when null. */
export function findKeyValue(
  sheets: readonly SheetData[],
  key: string,
  sheetName: string | null = null,
): KeyValue | null {
  const wanted = normaliseLabel(key);
  for (const sheet of sheets) {
    if (sheetName !== null && sheet.name !== sheetName) continue;
    const found = keyValuePairs(sheet).find((pair) => normaliseLabel(pair.key) === wanted);
    if (found) return found;
  }
  return null;
}

/** The 0-based row and column of an A1 address ("B2", "$C$10"); null when it is not one. */
export function parseCellAddress(address: string): { row: number; column: number } | null {
  const match = /^\$?([A-Z]{1,3})\$?([1-9][0-9]{0,6})$/.exec(address.trim().toUpperCase());
  if (!match) return null;
  const column = [...match[1]!].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;
  return { row: Number(match[2]) - 1, column };
}

/** What a locator points at in the file, or null when the sheet, cell or key is not there or blank. */
export function readFact(sheets: readonly SheetData[], locator: FactLocator): string | null {
  if (locator.kind === 'key') return findKeyValue(sheets, locator.key, locator.sheet)?.value ?? null;
  const sheet = sheets.find((s) => s.name === locator.sheet);
  const at = parseCellAddress(locator.address);
  if (!sheet || !at) return null;
  return cellText(sheet.rows[at.row]?.[at.column]);
}

/** Reads every fact the mapping locates; a located fact that is not found is a warning naming where it looked. */
export function readPlateFacts(
  sheets: readonly SheetData[],
  mapping: Pick<ColumnMapping, 'facts'>,
): { facts: PlateFacts; warnings: string[] } {
  const facts: PlateFacts = {};
  const warnings: string[] = [];
  for (const fact of PLATE_FACTS) {
    const locator = mapping.facts[fact];
    if (!locator) continue;
    const value = readFact(sheets, locator);
    if (value !== null) facts[fact] = value;
    else warnings.push(`The ${PLATE_FACT_LABEL[fact]} was not found ${describeLocator(locator)}.`);
  }
  return { facts, warnings };
}

/** Where a locator looks, for messages: "in cell B2 of sheet "Run info"" or "beside the key "Barcode"". */
export function describeLocator(locator: FactLocator): string {
  return locator.kind === 'cell'
    ? `in cell ${locator.address} of sheet "${shorten(locator.sheet)}"`
    : `beside the key "${shorten(locator.key)}"${locator.sheet ? ` on sheet "${shorten(locator.sheet)}"` : ''}`;
}

/**
 * Guesses where each fact is written: a key/value pair whose key is a common name of the fact, on any
 * sheet but the well sheet, or on the well sheet above its header row.
 */
export function guessFactLocators(
  sheets: readonly SheetData[],
  wellSheet: string,
  headerRow: number,
): { facts: ColumnMapping['facts']; found: PlateFacts } {
  const facts = Object.fromEntries(PLATE_FACTS.map((fact) => [fact, null])) as ColumnMapping['facts'];
  const found: PlateFacts = {};
  const pairs = sheets.flatMap((sheet) =>
    keyValuePairs(sheet, sheet.name === wellSheet ? headerRow - 1 : SEARCH_ROWS),
  );
  for (const fact of PLATE_FACTS) {
    for (const key of FACT_KEYS[fact]) {
      const pair = pairs.find((p) => normaliseLabel(p.key) === key);
      if (!pair) continue;
      facts[fact] = { kind: 'key', sheet: pair.sheet, key: pair.key };
      found[fact] = pair.value;
      break;
    }
  }
  return { facts, found };
}
