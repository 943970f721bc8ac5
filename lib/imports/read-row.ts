import 'server-only';
import type { WellRole } from '@/lib/domain/well-roles';
import { FIELD_LABEL, type ImportField, type UnitField } from './import-fields';
import { makeIssue, type ImportIssue, type ImportIssueCode } from './import-issue';
import { UNIT_KIND } from './guess-mapping';
import { normaliseIdentifier, normaliseLabel } from './normalise-text';
import { readBlock } from './block-scale';
import { describeFormat, parseWellPosition, wellFromIndex } from './plate-format';
import { readQuantity, readText, shorten } from './read-cell';
import type { RowContext } from './row-context';
import type { Cell } from './spreadsheet-types';
import { wellRoleForRow } from './value-map';
import { parseUnit, UNIT_LABEL, unitsOf, type Unit } from './units';

/** One row's values in canonical units (µM, pA, GΩ, MΩ, pF); null where missing or unreadable. */
export interface RowValues {
  well: string | null;
  rowIndex: number | null;
  columnIndex: number | null;
  role: WellRole | null;
  compound: string | null;
  concentration_uM: number | null;
  target: string | null;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  /** The fractional block as the file gives it (percent read as a fraction); absent when no column gives it. */
  givenBlock?: number | null;
  /** The use-dependent readout of the row's target, when the mapping maps one; the fields above are the tonic one. */
  useDependent?: {
    controlCurrent_pA: number | null;
    compoundCurrent_pA: number | null;
    givenBlock?: number | null;
  };
  sealResistance_GOhm: number | null;
  seriesResistance_MOhm: number | null;
  capacitance_pF: number | null;
}

/** A data row of the preview: its spreadsheet row number, values and findings. */
export interface PreviewRow {
  row: number;
  status: 'ok' | 'error';
  values: RowValues;
  issues: ImportIssue[];
}

/** Reads one data row (1-based `row` as the spreadsheet shows it) into canonical values and issues. */
export function readRow(cells: Cell[], row: number, ctx: RowContext): PreviewRow {
  const issues: ImportIssue[] = [];
  const report = (field: ImportField, code: ImportIssueCode, detail: string) => {
    const column = ctx.columns[field];
    issues.push(
      makeIssue({
        code,
        sheet: ctx.sheet,
        row,
        field,
        detail,
        column: column ? { letter: column.letter, header: column.header } : null,
      }),
    );
  };
  const cell = (field: ImportField): Cell | undefined => {
    const column = ctx.columns[field];
    return column ? cells[column.index] : undefined;
  };
  const quantity = (field: UnitField, unit: Unit): number | null => {
    const written = cell(field);
    const result = readQuantity(written, UNIT_KIND[field], unit, ctx.decimalComma, ctx.missing);
    if (!result.ok) report(field, result.code, `${FIELD_LABEL[field]}: ${result.detail}.`);
    else if (
      result.value !== null &&
      result.value < 0 &&
      field !== 'controlCurrent' &&
      field !== 'compoundCurrent'
    ) {
      report(
        field,
        'negative_value',
        `${FIELD_LABEL[field]} is negative (${shorten(String(written))}); it must be 0 or more.`,
      );
      return null;
    }
    return result.ok ? result.value : null;
  };
  const rowUnit = (
    field: 'concentrationUnit' | 'currentUnit',
    kind: 'concentration' | 'current',
    fallback: Unit,
  ): Unit => {
    const text = readText(cell(field));
    if (text === null) return fallback;
    const unit = parseUnit(text, kind);
    if (unit) return unit;
    const accepted = unitsOf(kind)
      .map((u) => UNIT_LABEL[u])
      .join(', ');
    report(field, 'unknown_unit', `"${shorten(text)}" is not a ${kind} unit; use one of ${accepted}.`);
    return fallback;
  };

  const { units } = ctx.mapping;
  const position = readWell(readText(cell('well')), ctx, (code, detail) => report('well', code, detail));
  const target = readTarget(ctx.mapping.fixedTarget ?? readText(cell('target')), ctx, (code, detail) =>
    report('target', code, detail),
  );
  const compoundText = readText(cell('compound'));
  const concentration_uM = quantity(
    'concentration',
    rowUnit('concentrationUnit', 'concentration', units.concentration),
  );
  const role = wellRoleForRow(cells, ctx, concentration_uM);
  const compound =
    role === 'test'
      ? checkCompound(compoundText, ctx, (code, detail) => report('compound', code, detail))
      : compoundText;
  if (
    role === 'test' &&
    concentration_uM === null &&
    !issues.some((issue) => issue.field === 'concentration')
  ) {
    report('concentration', 'missing_concentration', 'a test well needs a concentration; the cell is empty.');
  } else if (role === 'test' && concentration_uM === 0) {
    report('concentration', 'missing_concentration', 'a test well needs a concentration above 0.');
  }
  const currentUnit = (fallback: Unit) =>
    ctx.columns.currentUnit ? rowUnit('currentUnit', 'current', fallback) : fallback;
  const controlCurrent_pA = quantity('controlCurrent', currentUnit(units.controlCurrent));
  const blockGiven = ctx.columns.block !== undefined;
  let givenBlock: number | null = null;
  if (blockGiven) {
    const read = readBlock(cell('block'), ctx.blockScale, ctx.decimalComma, ctx.missing);
    if (read.ok) givenBlock = read.value;
    else report('block', read.code, `${FIELD_LABEL.block}: ${read.detail}.`);
  }
  if (controlCurrent_pA === 0 && !blockGiven)
    report(
      'controlCurrent',
      'zero_control_current',
      'control current is 0; block cannot be computed without a control current.',
    );
  let useDependent: RowValues['useDependent'];
  if (ctx.columns.useDependentBlock !== undefined || ctx.columns.useDependentCompoundCurrent !== undefined) {
    const udBlockGiven = ctx.columns.useDependentBlock !== undefined;
    let udBlock: number | null = null;
    if (udBlockGiven) {
      const read = readBlock(cell('useDependentBlock'), ctx.blockScale, ctx.decimalComma, ctx.missing);
      if (read.ok) udBlock = read.value;
      else report('useDependentBlock', read.code, `${FIELD_LABEL.useDependentBlock}: ${read.detail}.`);
    }
    const udControl = ctx.columns.useDependentControlCurrent
      ? quantity(
          'useDependentControlCurrent',
          currentUnit(units.useDependentControlCurrent ?? units.controlCurrent),
        )
      : controlCurrent_pA;
    useDependent = {
      controlCurrent_pA: udControl,
      compoundCurrent_pA: ctx.columns.useDependentCompoundCurrent
        ? quantity(
            'useDependentCompoundCurrent',
            currentUnit(units.useDependentCompoundCurrent ?? units.compoundCurrent),
          )
        : null,
      ...(udBlockGiven ? { givenBlock: udBlock } : {}),
    };
  }
  const values: RowValues = {
    well: position?.label ?? null,
    rowIndex: position?.rowIndex ?? null,
    columnIndex: position?.columnIndex ?? null,
    role,
    compound,
    concentration_uM,
    target,
    controlCurrent_pA,
    compoundCurrent_pA: quantity('compoundCurrent', currentUnit(units.compoundCurrent)),
    ...(blockGiven ? { givenBlock } : {}),
    sealResistance_GOhm: quantity('sealResistance', units.sealResistance),
    seriesResistance_MOhm: quantity('seriesResistance', units.seriesResistance),
    capacitance_pF: quantity('capacitance', units.capacitance),
    ...(useDependent ? { useDependent } : {}),
  };
  return { row, status: issues.some((issue) => issue.severity === 'error') ? 'error' : 'ok', values, issues };
}

type Report = (code: ImportIssueCode, detail: string) => void;

function readWell(text: string | null, ctx: RowContext, report: Report) {
  if (text === null) {
    report('missing_value', 'the well position is empty.');
    return null;
  }
  const names = ctx.mapping.wellNames;
  if (names !== 'label' && RUNNING_NUMBER.test(text)) return readWellNumber(Number(text), ctx, report);
  if (names === 'index') {
    report(
      'invalid_well',
      `"${shorten(text)}" is not a running well number; number the wells 1, 2, 3 … along the rows (A1 = 1), or choose well names like A1 on the mapping step.`,
    );
    return null;
  }
  const position = parseWellPosition(text);
  if (!position)
    report(
      'invalid_well',
      `"${shorten(text)}" is not a well position; write it as a row letter and column number, like A1 or A01.`,
    );
  return position;
}

const RUNNING_NUMBER = /^\d{1,6}$/;

/** A running well number (A1 = 1, along the rows) on the sheet's plate format. */
function readWellNumber(index: number, ctx: RowContext, report: Report) {
  if (index < 1) {
    report('invalid_well', `well number ${index} names no well; running well numbers start at 1 (well A1).`);
    return null;
  }
  const format = ctx.wellIndexFormat;
  const position = format === null ? null : wellFromIndex(index, format);
  if (!position)
    report(
      'well_outside_format',
      `well number ${index} is beyond ${describeFormat(format ?? 1536)}, which has ${format ?? 1536} wells.`,
    );
  return position;
}

function readTarget(text: string | null, ctx: RowContext, report: Report): string | null {
  if (text === null) {
    report('missing_value', 'the target is empty.');
    return null;
  }
  const known = ctx.targets.get(normaliseLabel(text)) ?? ctx.targetAliases.get(normaliseLabel(text));
  if (known) return known;
  const names = [...ctx.targets.values()].join(', ') || 'none yet';
  report('unknown_target', `target "${shorten(text)}" is not one of this screen's targets (${names}).`);
  return text;
}

function checkCompound(text: string | null, ctx: RowContext, report: Report): string | null {
  if (text === null) {
    report('missing_value', 'a test well needs a compound identifier; the cell is empty.');
    return null;
  }
  const registered = ctx.compounds.get(normaliseIdentifier(text));
  if (registered) return registered;
  report(
    'unknown_compound',
    `compound "${shorten(text)}" is not registered; register it or correct the identifier.`,
  );
  return text;
}
