// The quantities well QC and block read, each spelt one way: the quantity in camelCase, an underscore,
// the unit (sealResistance_GOhm). lib/domain/readouts.ts re-exports them as the app's vocabulary.

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
export const QC_FIELDS = [
  'controlCurrent_pA',
  'compoundCurrent_pA',
  'sealResistance_GOhm',
  'seriesResistance_MOhm',
  'capacitance_pF',
] as const;
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
