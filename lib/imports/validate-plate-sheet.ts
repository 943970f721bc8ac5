import 'server-only';
import { buildPlate, type ParsedPlate } from './build-plate';
import { checkPlateRows } from './check-plate-rows';
import type { ImportField } from './import-fields';
import { makeIssue, type ImportIssue } from './import-issue';
import { columnMappingDraftSchema, type ColumnMappingInput } from './mapping-schema';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import { readRow, type PreviewRow } from './read-row';
import { resolveColumns, type ResolvedColumn } from './resolve-columns';
import { makeRowContext } from './row-context';
import { shorten } from './read-cell';
import { roleChoiceForRow, unknownRoleValues } from './value-map';
import type { Cell, SheetData } from './spreadsheet-types';

/** The screen's names a sheet is checked against, and an optional plate format. */
export interface ValidatePlateOptions {
  /** Registered compound identifiers; test wells naming others are reported as unknown. */
  knownCompounds: readonly string[];
  /** The screen's target names; rows naming others are reported as unknown. */
  knownTargets: readonly string[];
  /** The plate format; inferred from the highest well position when absent. */
  plateFormat?: PlateFormat;
  /** The screen's remembered target aliases (alias as written → target name). */
  targetAliases?: Readonly<Record<string, string>>;
}

/** Everything the import preview shows: each row with its values or issues, and the plate built from good rows. */
export interface PlatePreview {
  sheet: string;
  headerRow: number;
  columns: Partial<Record<ImportField, ResolvedColumn>>;
  rows: PreviewRow[];
  /** Sheet-level issues first, then every row's, in row order. */
  issues: ImportIssue[];
  /** Null when the sheet cannot be read as a plate at all (empty, required columns missing, no well placed). */
  plate: ParsedPlate | null;
  /** Identifiers of test wells that are not registered, with their rows, so a chemist can register them. */
  unknownCompounds: { identifier: string; rows: number[] }[];
  unknownTargets: { name: string; rows: number[] }[];
  summary: { rows: number; okRows: number; errorRows: number; errors: number; warnings: number };
  /** Rows the role column's value map marks empty: skipped, not read into wells. */
  emptyWells: number;
  /** True when there is not a single error and the plate has wells. */
  ok: boolean;
}

/** Checks a sheet against a column mapping and the screen's names, and builds the parsed plate. */
export function validatePlateSheet(
  sheet: SheetData,
  mappingInput: ColumnMappingInput,
  options: ValidatePlateOptions,
): PlatePreview {
  const mapping = columnMappingDraftSchema.parse(mappingInput);
  const headerRow = mapping.headerRow;
  const finish = (
    rows: PreviewRow[],
    sheetIssues: ImportIssue[],
    columns: PlatePreview['columns'],
    plate: ParsedPlate | null,
  ) => summarise({ sheet: sheet.name, headerRow, columns, rows, issues: sheetIssues, plate, emptyWells });
  let emptyWells = 0;
  if (!sheet.rows.some((row) => !isBlank(row))) {
    return finish(
      [],
      [makeIssue({ code: 'empty_sheet', sheet: sheet.name, detail: 'the sheet is empty.' })],
      {},
      null,
    );
  }
  const { columns, issues } = resolveColumns(sheet, mapping);
  if (issues.length > 0) return finish([], issues, columns, null);
  const ctx = makeRowContext({
    sheet: sheet.name,
    decimalComma: sheet.decimalComma,
    columns,
    mapping,
    ...options,
  });
  // Value map (issue 18): role words neither mapped nor guessed stop the file; rows mapped to empty are skipped.
  const dataRows = sheet.rows.slice(headerRow).filter((cells) => !isBlank(cells));
  const unknownRoles = unknownRoleValues(dataRows, ctx);
  if (unknownRoles.length > 0) {
    const column = columns.role ? { letter: columns.role.letter, header: columns.role.header } : null;
    const detail = `the well-role column holds ${unknownRoles.length === 1 ? 'a word' : 'words'} Gatewell cannot place: ${unknownRoles.map((word) => `"${shorten(word)}"`).join(', ')}; on the mapping step assign each to negative control, positive control, test or empty.`;
    const issue = makeIssue({
      code: 'unknown_role',
      sheet: sheet.name,
      row: headerRow,
      field: 'role',
      column,
      detail,
    });
    return finish([], [issue], columns, null);
  }
  const rows: PreviewRow[] = [];
  sheet.rows.forEach((cells, index) => {
    if (index < headerRow || isBlank(cells)) return;
    if (roleChoiceForRow(cells, ctx) === 'empty') emptyWells += 1;
    else rows.push(readRow(cells, index + 1, ctx));
  });
  if (rows.length === 0) {
    const detail = `the sheet has a header row (row ${headerRow}) but no data rows below it.`;
    return finish([], [makeIssue({ code: 'no_data_rows', sheet: sheet.name, detail })], columns, null);
  }
  const decision = checkPlateRows(rows, sheet.name, columns, options.plateFormat);
  const plate = decision.format === null ? null : buildPlate(rows, decision.format, decision.source);
  return finish(rows, [], columns, plate);
}

function isBlank(row: Cell[]): boolean {
  return row.every((cell) => cell === null || (typeof cell === 'string' && cell.trim() === ''));
}

function summarise(
  input: Omit<PlatePreview, 'unknownCompounds' | 'unknownTargets' | 'summary' | 'ok'>,
): PlatePreview {
  for (const row of input.rows) row.issues.sort((a, b) => columnOrder(a) - columnOrder(b));
  const issues = [...input.issues, ...input.rows.flatMap((row) => row.issues)];
  const errors = issues.filter((issue) => issue.severity === 'error').length;
  const okRows = input.rows.filter((row) => row.status === 'ok').length;
  const plate = input.plate && input.plate.wells.length > 0 ? input.plate : null;
  return {
    ...input,
    plate,
    issues,
    unknownCompounds: gather(input.rows, 'unknown_compound', (row) => row.values.compound).map(
      ([identifier, rows]) => ({ identifier, rows }),
    ),
    unknownTargets: gather(input.rows, 'unknown_target', (row) => row.values.target).map(([name, rows]) => ({
      name,
      rows,
    })),
    summary: {
      rows: input.rows.length,
      okRows,
      errorRows: input.rows.length - okRows,
      errors,
      warnings: issues.length - errors,
    },
    ok: errors === 0 && plate !== null,
  };
}

function columnOrder(issue: ImportIssue): number {
  const letter = issue.column?.letter ?? '';
  return [...letter].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
}

function gather(
  rows: PreviewRow[],
  code: ImportIssue['code'],
  name: (row: PreviewRow) => string | null,
): [string, number[]][] {
  const found = new Map<string, number[]>();
  for (const row of rows) {
    const value = name(row);
    if (value === null || !row.issues.some((issue) => issue.code === code)) continue;
    found.set(value, [...(found.get(value) ?? []), row.row]);
  }
  return [...found];
}
