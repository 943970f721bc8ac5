import 'server-only';
// Plain data that leaves the parse worker: what a sheet holds, and why a file could not be read.

/** One cell as Gatewell keeps it: text, a finite number, a boolean, or nothing. Dates arrive as ISO 8601 text. */
export type Cell = string | number | boolean | null;

/** The container Gatewell recognised in the uploaded bytes. */
export type SpreadsheetFormat = 'xlsx' | 'xls' | 'csv' | 'markup';

/**
 * One sheet. `rows[r][c]` is the cell the spreadsheet shows at row r + 1, column c + 1 (A = 0), so
 * leading blank rows and columns are kept as empty arrays or nulls; rows may differ in length.
 */
export interface SheetData {
  name: string;
  rows: Cell[][];
  /** True for delimited text separated by semicolons, where "1,5" means 1.5. */
  decimalComma: boolean;
}

/** Why an upload could not be read, as a stable code. */
export type SpreadsheetErrorCode =
  | 'empty_file'
  | 'too_large'
  | 'not_spreadsheet'
  | 'not_utf8'
  | 'unreadable'
  | 'too_many_rows'
  | 'too_many_columns'
  | 'too_complex'
  | 'timed_out';

/** A refusal with a message for people that names the file. */
export interface SpreadsheetError {
  code: SpreadsheetErrorCode;
  message: string;
}

/** The outcome of reading an upload: its sheets, or why it could not be read. */
export type ParseSpreadsheetResult =
  { ok: true; format: SpreadsheetFormat; sheets: SheetData[] } | { ok: false; error: SpreadsheetError };
