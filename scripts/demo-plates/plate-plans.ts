// The four demo plates: what each holds, how noisy it is, which wells fail, and its export layout.
import { demoCompoundId, type DemoTarget } from './demo-compounds';

/** Why a demo well should fail well QC. */
export type FailureKind = 'low_seal' | 'small_current' | 'high_series_resistance' | 'missing_value';

/** A well made to fail, and for a missing value, which value is left out. */
export interface PlannedFailure {
  well: string;
  kind: FailureKind;
  missing?: 'compoundCurrent_pA' | 'sealResistance_GOhm' | 'capacitance_pF';
}

/** Noise of the ratio I_compound / I_control: run-down of vehicle wells and scatter of every well. */
export interface NoiseModel {
  /** Mean vehicle ratio after run-down (fraction). */
  rundownMean: number;
  /** Well-to-well SD of run-down (fraction). */
  rundownSd: number;
  /** SD of the measured ratio in test and vehicle wells (fraction). */
  ratioSd: number;
  /** Mean residual ratio in reference wells (fraction). */
  referenceRatio: number;
  /** SD of the ratio in reference wells (fraction). */
  referenceSd: number;
  /** Additive recording noise on the compound current, pA. */
  currentNoise_pA: number;
}

/** Gatewell's names for the two export layouts of the imagined demo rig. */
export type LayoutName = 'flat-sheet' | 'run-workbook' | 'flat-text';

export interface PlatePlan {
  file: string;
  plateName: string;
  target: DemoTarget;
  format: 96 | 384;
  seed: number;
  compounds: string[];
  /** Concentration series, µM, highest first. */
  concentrations_uM: number[];
  replicates: number;
  /** 1-based plate columns of vehicle and reference wells; test wells fill the columns between, down each column. */
  vehicleColumns: number[];
  referenceColumns: number[];
  noise: NoiseModel;
  failures: PlannedFailure[];
  layout: LayoutName;
}

const HALF_LOG_SERIES_UM = [30, 10, 3, 1, 0.3, 0.1, 0.03, 0.01];
/** Quiet plates: σ_veh ≈ 0.032, σ_ref = 0.015, so Z′ ≈ 1 − 3 (0.032 + 0.015) / 0.93 ≈ 0.85. */
const QUIET: NoiseModel = {
  rundownMean: 0.95,
  rundownSd: 0.02,
  ratioSd: 0.025,
  referenceRatio: 0.02,
  referenceSd: 0.015,
  currentNoise_pA: 8,
};
/** Noisy controls: σ_veh = √(0.09² + 0.06²) ≈ 0.11, σ_ref = 0.10, so Z′ ≈ 1 − 3 (0.11 + 0.10) / 0.93 ≈ 0.33, below the default limit 0.5. */
const NOISY_CONTROLS: NoiseModel = {
  rundownMean: 0.95,
  rundownSd: 0.09,
  ratioSd: 0.06,
  referenceRatio: 0.02,
  referenceSd: 0.1,
  currentNoise_pA: 8,
};

const ids = (...numbers: number[]) => numbers.map(demoCompoundId);

/** The 96-well demo layout: the half-log series in duplicate, vehicle in column 1 and reference in column 12. */
const PLATE_96: Pick<
  PlatePlan,
  'format' | 'concentrations_uM' | 'replicates' | 'vehicleColumns' | 'referenceColumns'
> = {
  format: 96,
  concentrations_uM: HALF_LOG_SERIES_UM,
  replicates: 2,
  vehicleColumns: [1],
  referenceColumns: [12],
};

/**
 * The demo plates. Seeds were picked so that, with Gatewell's fitting engine as first written, every true
 * IC50 inside the tested range lies within its fit's 95 % CI; over 40 seeds per plate the coverage
 * was 93–95 %, as a 95 % interval should give, so other seeds are just as honest but less tidy.
 */
export const PLATE_PLANS: PlatePlan[] = [
  {
    file: 'nav-96-plate-01.xlsx',
    plateName: 'NAV-P01',
    target: 'Nav1.7',
    ...PLATE_96,
    seed: 9601,
    compounds: ids(1, 2, 3, 4, 5),
    noise: QUIET,
    failures: [
      { well: 'B03', kind: 'low_seal' },
      { well: 'E05', kind: 'small_current' },
      { well: 'G08', kind: 'high_series_resistance' },
      { well: 'C10', kind: 'missing_value', missing: 'capacitance_pF' },
    ],
    layout: 'flat-sheet',
  },
  {
    file: 'nav-384-plate-02.xlsx',
    plateName: 'NAV-P02',
    target: 'Nav1.7',
    format: 384,
    seed: 38403,
    compounds: ids(1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12),
    concentrations_uM: HALF_LOG_SERIES_UM,
    replicates: 3,
    vehicleColumns: [1, 2],
    referenceColumns: [23, 24],
    noise: QUIET,
    failures: [
      { well: 'C04', kind: 'low_seal' },
      { well: 'K09', kind: 'low_seal' },
      { well: 'F12', kind: 'small_current' },
      { well: 'N15', kind: 'high_series_resistance' },
      { well: 'H18', kind: 'missing_value', missing: 'compoundCurrent_pA' },
      { well: 'D20', kind: 'missing_value', missing: 'sealResistance_GOhm' },
    ],
    layout: 'run-workbook',
  },
  {
    file: 'kv-96-plate-01.csv',
    plateName: 'KV-P01',
    target: 'Kv7.2',
    ...PLATE_96,
    seed: 9611,
    compounds: ids(1, 3, 6, 9, 12),
    noise: QUIET,
    failures: [
      { well: 'D04', kind: 'low_seal' },
      { well: 'F09', kind: 'missing_value', missing: 'compoundCurrent_pA' },
    ],
    layout: 'flat-text',
  },
  {
    file: 'nav-96-plate-03-noisy.xlsx',
    plateName: 'NAV-P03',
    target: 'Nav1.7',
    ...PLATE_96,
    seed: 9603,
    compounds: ids(6, 7, 8, 9, 10),
    noise: NOISY_CONTROLS,
    failures: [{ well: 'A06', kind: 'high_series_resistance' }],
    layout: 'flat-sheet',
  },
];
