// Well QC: each well against the screen's thresholds, with every reason it fails.
import { READOUT_LABEL, type QcField } from './quantities';
import { resolveQcThresholds, type QcThresholds } from './qc-thresholds';
import type { RawValue, WellRole } from './well';

/** The readouts of one well (QC_FIELDS, ./quantities.ts), as imported: values may be missing or text. */
export interface QcWell extends Record<QcField, RawValue> {
  wellId: string;
  role: WellRole;
  /**
   * The fractional block as the file gives it directly, instead of the current after compound: present
   * (a number, or null when missing) only for such readouts. The compound current is then not read, a
   * missing block fails the well, and a vehicle well's run-down is its block.
   */
  givenBlock?: RawValue;
}

export type QcReasonCode =
  | 'missing_value'
  | 'non_numeric_value'
  | 'seal_resistance_low'
  | 'seal_resistance_high'
  | 'control_current_small'
  | 'series_resistance_low'
  | 'series_resistance_high'
  | 'capacitance_out_of_range'
  | 'vehicle_rundown';

export interface QcReason {
  code: QcReasonCode;
  /** The readout concerned; null for reasons that combine readouts. */
  field: QcField | null;
  message: string;
}

export interface QcResult {
  wellId: string;
  passed: boolean;
  reasons: QcReason[];
}

export interface CheckWellsOptions {
  /**
   * Readouts the caller knows the plate does not carry at all (qc-rules.ts, readoutsAbsentFromEveryWell):
   * the rules reading them are not applied, so a well is not failed for lacking them. @default []
   */
  absentReadouts?: readonly QcField[];
}

/** Checks every well against the screen's thresholds (defaults where not given); one result per well, in order. */
export function checkWells(
  wells: readonly QcWell[],
  thresholds?: Partial<QcThresholds>,
  options: CheckWellsOptions = {},
): QcResult[] {
  const t = resolveQcThresholds(thresholds);
  const absent = new Set(options.absentReadouts ?? []);
  return wells.map((well) => checkWell(well, t, absent));
}

function checkWell(well: QcWell, t: QcThresholds, absent: ReadonlySet<QcField>): QcResult {
  const reasons: QcReason[] = [];
  const read = (field: QcField, needed: boolean): number | null =>
    needed && !absent.has(field) ? numeric(well, field, reasons) : null;
  const blockGiven = well.givenBlock !== undefined;
  const control = read('controlCurrent_pA', true);
  const compound = blockGiven ? null : read('compoundCurrent_pA', true);
  const givenBlock = blockGiven ? numericBlock(well.givenBlock, reasons) : null;
  const seal = read(
    'sealResistance_GOhm',
    t.sealResistanceMin_GOhm !== null || t.sealResistanceMax_GOhm !== null,
  );
  const series = read(
    'seriesResistance_MOhm',
    t.seriesResistanceMin_MOhm !== null || t.seriesResistanceMax_MOhm !== null,
  );
  const capacitance = read('capacitance_pF', t.capacitanceMin_pF !== null || t.capacitanceMax_pF !== null);
  const say = (code: QcReasonCode, field: QcField | null, message: string) =>
    reasons.push({ code, field, message });

  if (seal !== null && t.sealResistanceMin_GOhm !== null && seal < t.sealResistanceMin_GOhm) {
    say(
      'seal_resistance_low',
      'sealResistance_GOhm',
      `Seal resistance ${seal} GΩ is below the minimum of ${t.sealResistanceMin_GOhm} GΩ.`,
    );
  }
  if (seal !== null && t.sealResistanceMax_GOhm !== null && seal > t.sealResistanceMax_GOhm) {
    say(
      'seal_resistance_high',
      'sealResistance_GOhm',
      `Seal resistance ${seal} GΩ is above the plausible maximum of ${t.sealResistanceMax_GOhm} GΩ.`,
    );
  }
  if (control !== null && t.controlCurrentMin_pA !== null && Math.abs(control) < t.controlCurrentMin_pA) {
    say(
      'control_current_small',
      'controlCurrent_pA',
      `Control current ${control} pA is smaller than the minimum amplitude of ${t.controlCurrentMin_pA} pA.`,
    );
  }
  if (series !== null && t.seriesResistanceMin_MOhm !== null && series < t.seriesResistanceMin_MOhm) {
    say(
      'series_resistance_low',
      'seriesResistance_MOhm',
      `Series resistance ${series} MΩ is below the plausible minimum of ${t.seriesResistanceMin_MOhm} MΩ.`,
    );
  }
  if (series !== null && t.seriesResistanceMax_MOhm !== null && series > t.seriesResistanceMax_MOhm) {
    say(
      'series_resistance_high',
      'seriesResistance_MOhm',
      `Series resistance ${series} MΩ is above the maximum of ${t.seriesResistanceMax_MOhm} MΩ.`,
    );
  }
  if (capacitance !== null && outside(capacitance, t.capacitanceMin_pF, t.capacitanceMax_pF)) {
    say(
      'capacitance_out_of_range',
      'capacitance_pF',
      `Capacitance ${capacitance} pF is outside the range ${t.capacitanceMin_pF ?? '–'} to ${t.capacitanceMax_pF ?? '–'} pF.`,
    );
  }
  const rundown =
    givenBlock !== null
      ? givenBlock
      : control !== null && compound !== null && control !== 0
        ? 1 - compound / control
        : null;
  if (well.role === 'vehicle' && rundown !== null && t.vehicleRundownMax_fraction !== null) {
    if (rundown > t.vehicleRundownMax_fraction) {
      say(
        'vehicle_rundown',
        null,
        `Vehicle well ran down by ${Math.round(rundown * 100)} %, more than the limit of ${Math.round(t.vehicleRundownMax_fraction * 100)} %.`,
      );
    }
  }
  return { wellId: well.wellId, passed: reasons.length === 0, reasons };
}

/** The field as a finite number, or null after recording why it is missing or not a number. */
function numeric(well: QcWell, field: QcField, reasons: QcReason[]): number | null {
  const value = well[field];
  const { label, unit } = READOUT_LABEL[field];
  if (value === null || value === undefined || (typeof value === 'string' && value.trim() === '')) {
    reasons.push({ code: 'missing_value', field, message: `The ${label} is missing.` });
    return null;
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    reasons.push({
      code: 'non_numeric_value',
      field,
      message: `The ${label} (${JSON.stringify(String(value))}) is not a number in ${unit}.`,
    });
    return null;
  }
  return value;
}

/** A block given directly as a finite number, or null after recording why it is missing or not a number. */
function numericBlock(value: RawValue, reasons: QcReason[]): number | null {
  if (value === null || value === undefined || (typeof value === 'string' && value.trim() === '')) {
    reasons.push({ code: 'missing_value', field: null, message: 'The block is missing.' });
    return null;
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    reasons.push({
      code: 'non_numeric_value',
      field: null,
      message: `The block (${JSON.stringify(String(value))}) is not a number.`,
    });
    return null;
  }
  return value;
}

function outside(value: number, min: number | null, max: number | null): boolean {
  return (min !== null && value < min) || (max !== null && value > max);
}
