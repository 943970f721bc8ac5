// QC rules that read a recording property of the cell, and which of them a plate cannot be judged by.
import { READOUT_LABEL, type QcField } from './quantities';
import type { QcThresholds } from './qc-thresholds';
import type { RawValue } from './well';

/**
 * The QC rules that each read one recording property of the cell (seal, series resistance, capacitance),
 * and the control-current rule, which a plate whose file gives the block directly may have no current for.
 */
export type QcRuleCode = 'seal_resistance' | 'series_resistance' | 'capacitance' | 'control_current';

/** A readout the recording-property rules read, and the thresholds of its rule. */
export const RECORDING_RULES: readonly {
  rule: QcRuleCode;
  field: QcField;
  min: keyof QcThresholds;
  max: keyof QcThresholds;
}[] = [
  {
    rule: 'seal_resistance',
    field: 'sealResistance_GOhm',
    min: 'sealResistanceMin_GOhm',
    max: 'sealResistanceMax_GOhm',
  },
  {
    rule: 'series_resistance',
    field: 'seriesResistance_MOhm',
    min: 'seriesResistanceMin_MOhm',
    max: 'seriesResistanceMax_MOhm',
  },
  { rule: 'capacitance', field: 'capacitance_pF', min: 'capacitanceMin_pF', max: 'capacitanceMax_pF' },
];

/** The control-current rule: the smallest amplitude of the current before compound. */
const CONTROL_CURRENT_RULE = {
  rule: 'control_current',
  field: 'controlCurrent_pA',
  min: 'controlCurrentMin_pA',
  max: null,
} as const;

/** A rule that was switched on but not applied, because no well carries the readout it reads. */
export interface QcRuleNotApplied {
  rule: QcRuleCode;
  field: QcField;
  /** The rule as people read it: "series resistance". */
  label: string;
  /** Why, and what still runs, as one sentence for people. */
  message: string;
}

const isAbsent = (value: RawValue): boolean =>
  value === null || value === undefined || (typeof value === 'string' && value.trim() === '');

/**
 * The recording properties that no well of the list carries (absent or blank in every one): the plate
 * has no such readout at all. An empty list carries nothing and yet has nothing to judge, so it gives none.
 */
export function readoutsAbsentFromEveryWell(wells: readonly Partial<Record<QcField, RawValue>>[]): QcField[] {
  if (wells.length === 0) return [];
  return RECORDING_RULES.map((r) => r.field).filter((field) => wells.every((w) => isAbsent(w[field])));
}

/** The rules switched on by the thresholds whose readout is among `absent`, each with its message. */
export function qcRulesNotApplied(absent: readonly QcField[], thresholds: QcThresholds): QcRuleNotApplied[] {
  const rules = [...RECORDING_RULES, CONTROL_CURRENT_RULE];
  const limit = (key: keyof QcThresholds | null) => (key === null ? null : thresholds[key]);
  return rules
    .filter((r) => absent.includes(r.field) && (limit(r.min) !== null || limit(r.max) !== null))
    .map((r) => {
      const { label, unit } = READOUT_LABEL[r.field];
      const min = limit(r.min);
      const max = limit(r.max);
      const limits =
        min === null
          ? `at most ${max} ${unit}`
          : max === null
            ? `at least ${min} ${unit}`
            : `${min} to ${max} ${unit}`;
      return {
        rule: r.rule,
        field: r.field,
        label,
        message: `The ${label} rule (${limits}) was not applied: no well has a ${label}. The other QC rules, Z′ and the fits still run.`,
      };
    });
}
