import 'server-only';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import { READOUT_LABEL } from '@/lib/domain/readouts';
import type { ImportField } from './import-fields';
import { makeIssue, type ImportIssueCode } from './import-issue';
import { normaliseLabel } from './normalise-text';
import { describeFormat, fitsFormat, inferPlateFormat } from './plate-format';
import type { PreviewRow, RowValues } from './read-row';
import type { ResolvedColumns } from './resolve-columns';

/** The plate format in force and whether the person chose it or Gatewell inferred it from the wells. */
export interface FormatDecision {
  format: PlateFormat | null;
  source: 'chosen' | 'inferred';
}

/**
 * Checks rows against each other and against the plate format, adding issues to the rows (which this
 * module's caller created): wells outside the format, a well + target given twice, and a well whose
 * rows disagree on what it holds (an error) or on its cell properties (a warning; the first is kept).
 */
export function checkPlateRows(
  rows: PreviewRow[],
  sheet: string,
  columns: ResolvedColumns,
  chosen?: PlateFormat,
  /**
   * Rows of one well and target at different concentrations are cumulative applications, not errors:
   * `guess` allows them, `cumulative` also says so in the message of a repeated concentration.
   */
  application: 'single' | 'guess' | 'cumulative' = 'single',
): FormatDecision {
  const add = (
    row: PreviewRow,
    field: ImportField,
    code: ImportIssueCode,
    detail: string,
    severity: 'error' | 'warning' = 'error',
  ) => {
    const column = columns[field];
    row.issues.push(
      makeIssue({
        code,
        sheet,
        row: row.row,
        field,
        detail,
        severity,
        column: column ? { letter: column.letter, header: column.header } : null,
      }),
    );
  };
  const placed = rows.flatMap((row) => {
    const { well, rowIndex, columnIndex } = row.values;
    return well !== null && rowIndex !== null && columnIndex !== null
      ? [{ row, well, position: { rowIndex, columnIndex, label: well } }]
      : [];
  });
  const decision: FormatDecision = chosen
    ? { format: chosen, source: 'chosen' }
    : {
        format: inferPlateFormat(
          placed.map((p) => p.position).filter((position) => fitsFormat(position, 1536)),
        ),
        source: 'inferred',
      };
  const onPlate = placed.filter(({ row, well, position }) => {
    const fits = fitsFormat(position, decision.format ?? 1536);
    if (!fits) {
      const where = chosen
        ? `outside ${describeFormat(chosen)}`
        : `beyond the largest plate, ${describeFormat(1536)}`;
      add(row, 'well', 'well_outside_format', `well ${well} is ${where}.`);
    }
    return fits;
  });
  const readouts = new Map<string, number>();
  const wells = new Map<string, PreviewRow>();
  for (const { row, well } of onPlate) {
    const { target } = row.values;
    if (target !== null) {
      const cumulative = application !== 'single';
      const step = cumulative ? `|${row.values.concentration_uM ?? ''}` : '';
      const key = `${well}|${normaliseLabel(target)}${step}`;
      const first = readouts.get(key);
      if (first === undefined) readouts.set(key, row.row);
      else if (application === 'cumulative')
        add(
          row,
          'well',
          'duplicate_readout',
          `well ${well} with target ${target} at ${row.values.concentration_uM ?? '(no concentration)'} µM is already given in row ${first}; each application of a cell has one row per target.`,
        );
      else
        add(
          row,
          'well',
          'duplicate_readout',
          `well ${well} with target ${target} is already given in row ${first}; each well has one row per target.`,
        );
    }
    const first = wells.get(well);
    if (!first) wells.set(well, row);
    else compareWellRows(first, row, add, application !== 'single');
  }
  for (const row of rows)
    row.status = row.issues.some((issue) => issue.severity === 'error') ? 'error' : 'ok';
  return decision;
}

type Add = (
  row: PreviewRow,
  field: ImportField,
  code: ImportIssueCode,
  detail: string,
  severity?: 'error' | 'warning',
) => void;

function compareWellRows(first: PreviewRow, row: PreviewRow, add: Add, cumulative: boolean): void {
  const a = first.values;
  const b = row.values;
  const well = b.well;
  const sameConcentration = cumulative
    ? a.role !== 'test' || (a.concentration_uM !== null && b.concentration_uM !== null)
    : sameNumber(a.concentration_uM, b.concentration_uM);
  if (a.role !== b.role || a.compound !== b.compound || !sameConcentration) {
    const holds = (v: RowValues) =>
      `${v.role} ${v.compound ?? '(no compound)'} at ${v.concentration_uM ?? '(no concentration)'} µM`;
    add(
      row,
      'compound',
      'inconsistent_well',
      `well ${well} holds ${holds(b)} here but ${holds(a)} in row ${first.row}; a well holds one compound at one concentration.`,
    );
  }
  const properties = [
    ['sealResistance', 'sealResistance_GOhm'],
    ['seriesResistance', 'seriesResistance_MOhm'],
    ['capacitance', 'capacitance_pF'],
  ] as const;
  for (const [field, key] of properties) {
    const { unit } = READOUT_LABEL[key];
    const x = a[key];
    const y = b[key];
    if (x !== null && y !== null && !sameNumber(x, y)) {
      add(
        row,
        field,
        'conflicting_value',
        `well ${well} has ${y} ${unit} here but ${x} ${unit} in row ${first.row}; Gatewell keeps the value of row ${first.row}.`,
        'warning',
      );
    }
  }
}

function sameNumber(x: number | null, y: number | null): boolean {
  if (x === null || y === null) return x === y;
  return Math.abs(x - y) <= 1e-9 * Math.max(Math.abs(x), Math.abs(y));
}
