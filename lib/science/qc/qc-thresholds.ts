// Per-screen well QC thresholds, checked and defaulted in one place. null switches a check off.

export interface QcThresholds {
  /** Minimum seal resistance (GΩ). @default 0.5 (common practice, no source) */
  sealResistanceMin_GOhm: number | null;
  /** Maximum seal resistance (GΩ). @default 1000 (Lei et al. 2019, Biophys J 117:2438, accepted range 0.1–1000 GΩ) */
  sealResistanceMax_GOhm: number | null;
  /** Minimum |control current| (pA). @default 200 (common practice, no source) */
  controlCurrentMin_pA: number | null;
  /** Minimum series resistance (MΩ). @default 1 (Lei et al. 2019, accepted range 1–25 MΩ) */
  seriesResistanceMin_MOhm: number | null;
  /** Maximum series resistance (MΩ). @default 25 (Lei et al. 2019, accepted range 1–25 MΩ) */
  seriesResistanceMax_MOhm: number | null;
  /** Minimum cell capacitance (pF). @default 1 (Lei et al. 2019, accepted range 1–100 pF) */
  capacitanceMin_pF: number | null;
  /** Maximum cell capacitance (pF). @default 100 (Lei et al. 2019, accepted range 1–100 pF) */
  capacitanceMax_pF: number | null;
  /**
   * Largest run-down in a vehicle well, 1 − I_compound/I_control (fraction).
   * @default 0.2 (common practice, no source)
   */
  vehicleRundownMax_fraction: number | null;
}

export const DEFAULT_QC_THRESHOLDS: Readonly<QcThresholds> = Object.freeze({
  sealResistanceMin_GOhm: 0.5,
  sealResistanceMax_GOhm: 1000,
  controlCurrentMin_pA: 200,
  seriesResistanceMin_MOhm: 1,
  seriesResistanceMax_MOhm: 25,
  capacitanceMin_pF: 1,
  capacitanceMax_pF: 100,
  vehicleRundownMax_fraction: 0.2,
});

/** A screen's thresholds over the defaults; throws RangeError naming a threshold that is not a finite number ≥ 0 or a min above its max. */
export function resolveQcThresholds(overrides: Partial<QcThresholds> = {}): QcThresholds {
  const t: QcThresholds = { ...DEFAULT_QC_THRESHOLDS };
  for (const key of Object.keys(DEFAULT_QC_THRESHOLDS) as (keyof QcThresholds)[]) {
    const value = overrides[key];
    if (value === undefined) continue;
    if (value !== null && !(Number.isFinite(value) && value >= 0)) {
      throw new RangeError(`QC threshold ${key} must be a finite number ≥ 0 or null, got ${String(value)}`);
    }
    t[key] = value;
  }
  const pairs = [
    ['sealResistanceMin_GOhm', 'sealResistanceMax_GOhm'],
    ['seriesResistanceMin_MOhm', 'seriesResistanceMax_MOhm'],
    ['capacitanceMin_pF', 'capacitanceMax_pF'],
  ] as const;
  for (const [min, max] of pairs) {
    const low = t[min];
    const high = t[max];
    if (low !== null && high !== null && low > high)
      throw new RangeError(`QC threshold ${min} (${low}) is above ${max} (${high})`);
  }
  return t;
}
