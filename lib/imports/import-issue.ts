import 'server-only';
import type { ImportField } from './import-fields';

/** Stable codes of everything Gatewell may say about a sheet or one of its rows. */
export type ImportIssueCode =
  | 'empty_sheet'
  | 'no_data_rows'
  | 'missing_column'
  | 'duplicate_header'
  | 'missing_value'
  | 'not_numeric'
  | 'not_finite'
  | 'unknown_unit'
  | 'negative_value'
  | 'zero_control_current'
  | 'invalid_well'
  | 'well_outside_format'
  | 'unknown_compound'
  | 'unknown_target'
  | 'unknown_role'
  | 'missing_concentration'
  | 'duplicate_readout'
  | 'inconsistent_well'
  | 'conflicting_value'
  | 'unreadable_layout';

/** A column as people find it: its letter and its header text (null when the header cell is blank). */
export interface IssueColumn {
  letter: string;
  header: string | null;
}

/** One finding; errors keep a row out of the plate, warnings only inform. */
export interface ImportIssue {
  code: ImportIssueCode;
  severity: 'error' | 'warning';
  sheet: string;
  /** 1-based row number as the spreadsheet shows it (the header row counts); null for the whole sheet. */
  row: number | null;
  column: IssueColumn | null;
  field: ImportField | null;
  /** The full sentence, starting with where: `Sheet "Readouts", row 14, column F "I control [pA]": …`. */
  message: string;
}

/** Where an issue is, as the start of its message. */
export function describeLocation(sheet: string, row: number | null, column: IssueColumn | null): string {
  const parts = [`Sheet "${sheet}"`];
  if (row !== null) parts.push(`row ${row}`);
  if (column)
    parts.push(column.header ? `column ${column.letter} "${column.header}"` : `column ${column.letter}`);
  return parts.join(', ');
}

/** Builds an issue whose message is its location followed by `detail`. */
export function makeIssue(input: {
  code: ImportIssueCode;
  sheet: string;
  detail: string;
  row?: number | null;
  column?: IssueColumn | null;
  field?: ImportField | null;
  severity?: 'error' | 'warning';
}): ImportIssue {
  const row = input.row ?? null;
  const column = input.column ?? null;
  return {
    code: input.code,
    severity: input.severity ?? 'error',
    sheet: input.sheet,
    row,
    column,
    field: input.field ?? null,
    message: `${describeLocation(input.sheet, row, column)}: ${input.detail}`,
  };
}
