// Quantities Gatewell reads from plate exports, judges in QC and reports, each spelt one way: the quantity in
// camelCase, an underscore, the unit (sealResistance_GOhm). Database columns are the same words in
// snake_case (seal_resistance_gohm), mapped by each model attribute's `field`. Exports convert to these
// units once, at the import (lib/imports/units.ts).

export {
  QC_FIELDS,
  READOUT_LABEL,
  UNIT_SYMBOL,
  type CurrentReadouts,
  type QcField,
  type WellQuantities,
} from '@/lib/science/qc/quantities';

/**
 * A screen's QC limits as the screen stores them (table screens) and its form edits them; the science
 * takes them as `QcThresholds` (lib/science/qc/qc-thresholds.ts), spelt the same.
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
