import 'server-only';
import { buildPlate, type ParsedPlate } from './build-plate';
import { checkPlateRows } from './check-plate-rows';
import { FIELD_LABEL, REQUIRED_FIELDS, type ImportField } from './import-fields';
import { describeLocation, makeIssue, type ImportIssue, type ImportIssueCode } from './import-issue';
import { columnMappingDraftSchema, type ColumnMapping, type ColumnMappingInput } from './mapping-schema';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import { readRow, type PreviewRow } from './read-row';
import { resolveColumns, type ResolvedColumn } from './resolve-columns';
import { makeRowContext } from './row-context';
import { readText, shorten } from './read-cell';
import { decideBlockScale } from './block-scale';
import { formatForWellCount } from './plate-format';
import { isSummaryRow, isUnitsRow } from './skip-rows';
import { roleChoiceForRow, unknownRoleValues } from './value-map';
import { fileRowOf, placeIssue, reshapeSheet } from './reshape-table';
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

/**
 * A problem of the whole sheet, not of one row, that keeps the plate from being built: the check step
 * shows these first, each with what to do. `no_header_row` stands for the missing columns it sums up,
 * `no_wells` for rows that all have errors, `plate_split` for a file that cannot be split into its plates
 * as the mapping says (lib/imports/split-plates.ts).
 */
export interface FileProblem {
  code: ImportIssueCode | 'no_header_row' | 'no_wells' | 'plate_split';
  /** Where and what, as one sentence: `Sheet "Readouts", row 1: …`. */
  message: string;
  /** What the person can do about it, as one or two sentences. */
  whatToDo: string;
}

/** A row below the header skipped as not a well (1-based row number as the spreadsheet shows it). */
export interface SkippedRow {
  row: number;
  reason: 'units' | 'summary';
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
  /** Whole-sheet problems with what to do about each; empty when the sheet can be read as a plate. */
  fileProblems: FileProblem[];
  /** Identifiers of test wells that are not registered, with their rows, so a chemist can register them. */
  unknownCompounds: { identifier: string; rows: number[] }[];
  unknownTargets: { name: string; rows: number[] }[];
  summary: { rows: number; okRows: number; errorRows: number; errors: number; warnings: number };
  /** Rows the role column's value map marks empty: skipped, not read into wells. */
  emptyWells: number;
  /** Rows below the header that are not wells and were skipped: a row of units, summary rows. */
  skippedRows: SkippedRow[];
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
  // A wide or grid sheet is read as a long table first (reshape-table.ts), its issues placed on the file.
  if (mapping.layout.kind !== 'long') return validateReshaped(sheet, mapping, options);
  const headerRow = mapping.headerRow;
  const finish = (
    rows: PreviewRow[],
    sheetIssues: ImportIssue[],
    columns: PlatePreview['columns'],
    plate: ParsedPlate | null,
  ) =>
    summarise(
      { sheet: sheet.name, headerRow, columns, rows, issues: sheetIssues, plate, emptyWells, skippedRows },
      (preview) => fileProblemsOf(preview, mapping),
    );
  let emptyWells = 0;
  const skippedRows: SkippedRow[] = [];
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
  // Rows that are not wells (issue 18): a row of units under the header, summary rows.
  const unitsRow = sheet.rows[headerRow];
  if (unitsRow && mapping.rows.unitsRow !== 'no' && (mapping.rows.unitsRow === 'yes' || isUnitsRow(unitsRow)))
    skippedRows.push({ row: headerRow + 1, reason: 'units' });
  const wellIndex = columns.well?.index ?? null;
  sheet.rows.forEach((cells, index) => {
    if (index <= headerRow || !mapping.rows.skipSummaryRows || isBlank(cells)) return;
    if (isSummaryRow(cells, wellIndex, mapping.rows.summaryWords))
      skippedRows.push({ row: index + 1, reason: 'summary' });
  });
  const skipped = new Set(skippedRows.map((s) => s.row - 1));
  // Value map (issue 18): role words neither mapped nor guessed stop the file; rows mapped to empty are skipped.
  const dataRows = sheet.rows
    .slice(headerRow)
    .filter((cells, i) => !isBlank(cells) && !skipped.has(headerRow + i));
  const blockColumn = columns.block;
  const ctx = makeRowContext({
    sheet: sheet.name,
    decimalComma: sheet.decimalComma,
    columns,
    mapping,
    ...options,
    blockScale: blockColumn
      ? decideBlockScale(
          mapping.units.block,
          blockColumn.header,
          dataRows.map((cells) => cells[blockColumn.index]),
          sheet.decimalComma,
        )
      : 'fraction',
    wellIndexFormat: wellIndexFormat(dataRows, columns.well?.index, mapping, options.plateFormat),
  });
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
    if (index < headerRow || isBlank(cells) || skipped.has(index)) return;
    if (roleChoiceForRow(cells, ctx) === 'empty') emptyWells += 1;
    else rows.push(readRow(cells, index + 1, ctx));
  });
  if (rows.length === 0) {
    const detail = `the sheet has a header row (row ${headerRow}) but no data rows below it.`;
    return finish([], [makeIssue({ code: 'no_data_rows', sheet: sheet.name, detail })], columns, null);
  }
  const decision = checkPlateRows(rows, sheet.name, columns, options.plateFormat, mapping.application);
  const plate = decision.format === null ? null : buildPlate(rows, decision.format, decision.source);
  return finish(rows, [], columns, plate);
}

/**
 * Validates the long table read from a wide or grid sheet, then moves every issue, row list and
 * whole-file problem to the file's own rows and cells. Preview rows keep the table's row numbers (a row
 * per well and target), which name the readouts; their issues name the file's cells.
 */
function validateReshaped(
  sheet: SheetData,
  mapping: ColumnMapping,
  options: ValidatePlateOptions,
): PlatePreview {
  const reshaped = reshapeSheet(sheet, mapping)!;
  const noRows = { emptyWells: 0, skippedRows: [] };
  if (!reshaped.ok) {
    const base = { sheet: sheet.name, headerRow: mapping.headerRow, columns: {}, rows: [], plate: null };
    return summarise({ ...base, ...noRows, issues: reshaped.issues }, (p) => fileProblemsOf(p, mapping));
  }
  const { table } = reshaped;
  const inner = validatePlateSheet(
    table.sheet,
    {
      ...mapping,
      layout: { kind: 'long' },
      headerRow: 1,
      rows: { ...mapping.rows, unitsRow: table.kind === 'wide' ? mapping.rows.unitsRow : 'no' },
    },
    options,
  );
  const place = (issue: ImportIssue) => placeIssue(issue, table);
  const fileRows = (rows: number[]) => [...new Set(rows.map((r) => fileRowOf(r, table)))];
  const rows = inner.rows.map((row) => ({ ...row, issues: row.issues.map(place) }));
  const sheetIssues = inner.issues.slice(0, inner.issues.length - inner.rows.flatMap((r) => r.issues).length);
  const placed = summarise(
    {
      sheet: sheet.name,
      headerRow: mapping.headerRow,
      columns: inner.columns,
      rows,
      issues: sheetIssues.map(place),
      plate: inner.plate,
      emptyWells: inner.emptyWells,
      skippedRows: inner.skippedRows.map((s) => ({ ...s, row: fileRowOf(s.row, table) })),
    },
    (p) => fileProblemsOf(p, mapping),
  );
  return {
    ...placed,
    unknownCompounds: placed.unknownCompounds.map((c) => ({ ...c, rows: fileRows(c.rows) })),
    unknownTargets: placed.unknownTargets.map((t) => ({ ...t, rows: fileRows(t.rows) })),
  };
}

/**
 * The plate format running well numbers count along: the chosen format, else the smallest holding the
 * highest number; null when the well column holds no running number (or names wells as labels only).
 */
function wellIndexFormat(
  rows: readonly Cell[][],
  wellIndex: number | undefined,
  mapping: ColumnMapping,
  chosen: PlateFormat | undefined,
): PlateFormat | null {
  if (wellIndex === undefined || mapping.wellNames === 'label') return null;
  let highest = 0;
  for (const cells of rows) {
    const text = readText(cells[wellIndex]);
    if (text !== null && /^\d{1,6}$/.test(text)) highest = Math.max(highest, Number(text));
  }
  if (highest === 0) return null;
  return chosen ?? formatForWellCount(highest);
}

function isBlank(row: Cell[]): boolean {
  return row.every((cell) => cell === null || (typeof cell === 'string' && cell.trim() === ''));
}

function summarise(
  input: Omit<PlatePreview, 'unknownCompounds' | 'unknownTargets' | 'summary' | 'ok' | 'fileProblems'>,
  problems: (preview: Omit<PlatePreview, 'fileProblems'>) => FileProblem[],
): PlatePreview {
  for (const row of input.rows) row.issues.sort((a, b) => columnOrder(a) - columnOrder(b));
  const issues = [...input.issues, ...input.rows.flatMap((row) => row.issues)];
  const errors = issues.filter((issue) => issue.severity === 'error').length;
  const okRows = input.rows.filter((row) => row.status === 'ok').length;
  const plate = input.plate && input.plate.wells.length > 0 ? input.plate : null;
  const preview = {
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
  return { ...preview, fileProblems: problems(preview) };
}

/**
 * The whole-sheet problems of a preview, each with what to do: a sheet without cells or without rows
 * below its header, a header row holding none of the mapped columns, each column missing or repeated,
 * and rows that all have errors (so no well is left).
 */
function fileProblemsOf(preview: Omit<PlatePreview, 'fileProblems'>, mapping: ColumnMapping): FileProblem[] {
  const { sheet, headerRow } = preview;
  const sheetIssues = preview.issues.filter((issue) => SHEET_CODES.has(issue.code));
  const columnIssues = sheetIssues.filter(
    (i) => i.code === 'missing_column' || i.code === 'duplicate_header',
  );
  if (columnIssues.length > 0 && Object.keys(preview.columns).length === 0) {
    const missing = new Set(columnIssues.map((i) => i.field));
    const needed = REQUIRED_FIELDS.filter((field) => missing.has(field)).map((field) => FIELD_LABEL[field]);
    return [
      {
        code: 'no_header_row',
        message: `${describeLocation(sheet, headerRow, null)}: no header row found: this row names none of the columns a plate needs (${needed.join(', ')}).`,
        whatToDo:
          'On the mapping step, set the header row to the row that holds the column names and choose the column for each field; if the wells are on another sheet, choose that sheet.',
      },
    ];
  }
  const problems: FileProblem[] = sheetIssues.map((issue) => ({
    code: issue.code,
    message: issue.message,
    whatToDo: whatToDo(issue, mapping, headerRow),
  }));
  if (problems.length === 0 && preview.rows.length > 0 && preview.plate === null) {
    const first = preview.issues.find((issue) => issue.severity === 'error');
    const why = first
      ? `no row can be stored as a well. The first error: ${first.message}`
      : 'no row can be placed on a plate.';
    problems.push({
      code: 'no_wells',
      message: `${describeLocation(sheet, null, null)}: no well is left for the plate: ${why}`,
      whatToDo:
        'The same error in every row usually means a column is mapped to the wrong field or read in the wrong unit: check the mapping step, then the first rows below.',
    });
  }
  return problems;
}

/** The issues that concern the whole sheet, never one row. */
const SHEET_CODES = new Set<ImportIssueCode>([
  'empty_sheet',
  'no_data_rows',
  'missing_column',
  'duplicate_header',
  'unreadable_layout',
]);

function whatToDo(issue: ImportIssue, mapping: ColumnMapping, headerRow: number): string {
  const field = issue.field ? FIELD_LABEL[issue.field] : 'field';
  switch (issue.code) {
    case 'empty_sheet':
      return 'Choose the sheet that holds the wells on the mapping step, or export the plate from the instrument again.';
    case 'no_data_rows':
      return `Check the header row on the mapping step (now row ${headerRow}): the wells are read from the rows below it. If the sheet really holds no wells, export the plate again.`;
    case 'duplicate_header':
      return `On the mapping step, choose another column for the ${field} if one of the two holds something else; if both hold it, rename one of them in the file, as Gatewell cannot tell which to read.`;
    case 'missing_column':
      if (issue.field && mapping.columns[issue.field] === null) {
        const orTarget = issue.field === 'target' ? ', or name one target for the whole sheet' : '';
        return `On the mapping step, choose the column that holds the ${field}${orTarget}. If the export has no such column, set the instrument to write it: Gatewell cannot store a plate without the ${field}.`;
      }
      return `On the mapping step, choose the column of this sheet that holds the ${field}, or check the header row (now row ${headerRow}).`;
    case 'unreadable_layout':
      return mapping.layout.kind === 'grid'
        ? 'Each plate grid needs a title above its column numbers and rows lettered from A, all grids of one size; correct the export, or choose how the sheet is laid out on the mapping step.'
        : 'Every target needs its block of columns, each header opening with the target as the file writes it; correct the export, or choose how the sheet is laid out on the mapping step.';
    default:
      return 'Correct this on the mapping step, or in the export if the mapping cannot.';
  }
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
