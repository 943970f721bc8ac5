// Quantities Gatewell reads from plate exports, judges in QC and reports, each spelt one way: the quantity in
// camelCase, an underscore, the unit (sealResistance_GOhm). Database columns are the same words in
// snake_case (seal_resistance_gohm), mapped by each model attribute's `field`. Exports convert to these
// units once, at the import (lib/imports/units.ts).

/** Units as people read them. */
export const UNIT_SYMBOL = { uM: 'µM', pA: 'pA', GOhm: 'GΩ', MOhm: 'MΩ', pF: 'pF' } as const;

/** What one well holds and its cell's recording properties (table wells). */
export interface WellQuantities {
  concentration_uM: number | null;
  sealResistance_GOhm: number | null;
  seriesResistance_MOhm: number | null;
  capacitance_pF: number | null;
}

/** The currents of one target in one well (table readouts; sign as recorded, inward negative). */
export interface CurrentReadouts {
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
}

/** The readouts well QC checks, by their one name. */
export const QC_FIELDS = ['controlCurrent_pA', 'compoundCurrent_pA', 'sealResistance_GOhm', 'seriesResistance_MOhm', 'capacitance_pF'] as const;
export type QcField = (typeof QC_FIELDS)[number];

/** Each readout as people read it, with its unit. */
export const READOUT_LABEL: Record<QcField | 'concentration_uM', { label: string; unit: string }> = {
  concentration_uM: { label: 'concentration', unit: UNIT_SYMBOL.uM },
  controlCurrent_pA: { label: 'control current', unit: UNIT_SYMBOL.pA },
  compoundCurrent_pA: { label: 'compound current', unit: UNIT_SYMBOL.pA },
  sealResistance_GOhm: { label: 'seal resistance', unit: UNIT_SYMBOL.GOhm },
  seriesResistance_MOhm: { label: 'series resistance', unit: UNIT_SYMBOL.MOhm },
  capacitance_pF: { label: 'capacitance', unit: UNIT_SYMBOL.pF },
};

/**
 * A screen's QC limits as the screen stores them (table screens) and its form edits them; the science
 * takes them as `QcThresholds` (lib/science/qc-thresholds.ts), spelt the same.
 */
export interface ScreenQcLimits {
  /** Lowest acceptable Z′ per target (no unit). */
  zPrimeMin: number;
  sealResistanceMin_GOhm: number;
  /** Smallest |control current| a readout needs. */
  controlCurrentMin_pA: number;
  seriesResistanceMax_MOhm: number;
  capacitanceMin_pF: number;
  capacitanceMax_pF: number;
  /** Largest run-down of a vehicle well, 1 − I_compound/I_control, as a fraction (the form asks in %). */
  vehicleRundownMax_fraction: number;
  /** Rescale block so that vehicle is 0 and the reference blocker 1. */
  normaliseToReference: boolean;
}

/** An IC50 as a fit reports it (table fits): the estimate, its 95 % interval, or a lower bound when above range. */
export interface Ic50Readout {
  ic50_uM: number | null;
  ic50CiLow_uM: number | null;
  ic50CiHigh_uM: number | null;
  ic50LowerBound_uM: number | null;
}
