// Invented plate templates for the scale fill: 384 wells, two targets, 80 compound slots at four
// concentrations, run through Gatewell's own analysis (QC, block, Z′ and Hill fits) so that every stored
// shape is the one an import and its fit job write. The fill copies these templates onto thousands of
// plates server-side, putting real compounds and targets in the slots. Invented data, not measurements.
import { analysePlate, type AnalysisReadout, type AnalysisWell } from '@/lib/science/plate-analysis';
import { analysisSettings } from '@/lib/plates/settings';
import { fitRow } from '@/lib/plates/fit-row';

export const ROWS = 16;
export const COLUMNS = 24;
/** Columns 1–2 vehicle, 23–24 reference, 3–22 test: 320 test wells, 80 compounds at 4 concentrations. */
export const COMPOUND_SLOTS = 80;
export const CONCENTRATIONS_UM = [0.1, 1, 10, 30] as const;
export const TARGET_SLOTS = ['t0', 't1'] as const;

/** The screen settings the templates are analysed with (the fill's screens use the same). */
export const SCALE_SCREEN_LIMITS = {
  zPrimeMin: 0.5,
  sealResistanceMin_GOhm: 0.5,
  controlCurrentMin_pA: 200,
  seriesResistanceMax_MOhm: 25,
  capacitanceMin_pF: 1,
  capacitanceMax_pF: 100,
  vehicleRundownMax_fraction: 0.2,
  normaliseToReference: false,
};

export interface TemplateWell {
  position: string;
  row_index: number;
  column_index: number;
  role: 'vehicle' | 'reference' | 'test';
  slot: number | null;
  concentration_um: number | null;
  seal_resistance_gohm: number;
  series_resistance_mohm: number;
  capacitance_pf: number;
}

export interface TemplateReadout {
  position: string;
  target_slot: number;
  control_current_pa: number;
  compound_current_pa: number;
  fractional_block: number | null;
  qc_reasons: unknown[];
}

export interface TemplateFit {
  slot: number;
  target_slot: number;
  model: string;
  status: string;
  message: string;
  ic50_um: number | null;
  ic50_ci_low_um: number | null;
  ic50_ci_high_um: number | null;
  ic50_lower_bound_um: number | null;
  log10_ic50_se: number | null;
  hill: number | null;
  top: number | null;
  bottom: number | null;
  r2: number | null;
  residual_sd: number | null;
  n: number;
  flags: unknown;
  estimate: unknown;
}

export interface PlateTemplate {
  wells: TemplateWell[];
  readouts: TemplateReadout[];
  fits: TemplateFit[];
  /** The plate's QC summary with target slots `t0`, `t1` where the target ids go. */
  qcSummary: unknown[];
}

/** Mulberry32: a small seeded generator, so that a fill is reproducible. */
function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normal(random: () => number): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

const round = (value: number, digits: number) => Number(value.toFixed(digits));
const position = (row: number, column: number) =>
  `${String.fromCharCode(65 + row)}${String(column + 1).padStart(2, '0')}`;

/** One invented template plate from its seed. */
export function makeTemplate(seed: number): PlateTemplate {
  const random = generator(seed);
  // Per slot and target: an IC50 log-uniform over 0.03–300 µM (a fifth inactive) and a Hill slope 0.8–1.5.
  const truth = Array.from({ length: COMPOUND_SLOTS }, () =>
    TARGET_SLOTS.map(() => ({
      ic50: random() < 0.2 ? Number.POSITIVE_INFINITY : 10 ** (-1.5 + 4 * random()),
      hill: 0.8 + 0.7 * random(),
    })),
  );
  const controlMedian = [2500, 900];
  const wells: TemplateWell[] = [];
  const readouts: TemplateReadout[] = [];
  const analysisWells: AnalysisWell[] = [];
  const analysisReadouts: AnalysisReadout[] = [];
  for (let row = 0; row < ROWS; row++) {
    for (let column = 0; column < COLUMNS; column++) {
      const role = column < 2 ? 'vehicle' : column >= COLUMNS - 2 ? 'reference' : 'test';
      const testIndex = row * 20 + (column - 2);
      const slot = role === 'test' ? Math.floor(testIndex / 4) : null;
      const concentration = role === 'test' ? CONCENTRATIONS_UM[testIndex % 4]! : null;
      // About 4 % of cells seal poorly (below 0.5 GΩ) and fail QC, as a rig's bad wells would.
      const seal = random() < 0.04 ? round(0.1 + 0.35 * random(), 2) : round(0.8 + 2.5 * random(), 2);
      const well: TemplateWell = {
        position: position(row, column),
        row_index: row,
        column_index: column,
        role,
        slot,
        concentration_um: concentration,
        seal_resistance_gohm: seal,
        series_resistance_mohm: round(Math.max(3, 10 + 3 * normal(random)), 1),
        capacitance_pf: round(Math.max(5, 18 + 4 * normal(random)), 1),
      };
      wells.push(well);
      analysisWells.push({
        id: well.position,
        role,
        compoundId: slot === null ? null : String(slot),
        concentration_uM: concentration,
        sealResistance_GOhm: well.seal_resistance_gohm,
        seriesResistance_MOhm: well.series_resistance_mohm,
        capacitance_pF: well.capacitance_pf,
        excluded: false,
      });
      TARGET_SLOTS.forEach((target, t) => {
        const control = round(controlMedian[t]! * Math.exp(0.15 * normal(random)), 1);
        const rundown = 0.95 + 0.02 * normal(random);
        let ratio: number;
        if (role === 'vehicle') ratio = rundown;
        else if (role === 'reference') ratio = Math.max(0, 0.02 + 0.015 * normal(random));
        else {
          const { ic50, hill } = truth[slot!]![t]!;
          const block = Number.isFinite(ic50) ? 1 / (1 + (ic50 / concentration!) ** hill) : 0;
          ratio = rundown * (1 - block) + 0.025 * normal(random);
        }
        const readout = {
          position: well.position,
          target_slot: t,
          control_current_pa: control,
          compound_current_pa: round(control * ratio + 8 * normal(random), 1),
        };
        analysisReadouts.push({
          id: `${well.position}:${t}`,
          wellId: well.position,
          target,
          controlCurrent_pA: readout.control_current_pa,
          compoundCurrent_pA: readout.compound_current_pa,
        });
        readouts.push({ ...readout, fractional_block: null, qc_reasons: [] });
      });
    }
  }
  const analysis = analysePlate(analysisWells, analysisReadouts, analysisSettings(SCALE_SCREEN_LIMITS), {
    fits: true,
  });
  analysis.readouts.forEach((result, i) => {
    readouts[i]!.fractional_block = result.block;
    readouts[i]!.qc_reasons = result.qcReasons;
  });
  const fits = analysis.fits.map((fit): TemplateFit => {
    const row = fitRow(fit, {
      plateId: '',
      compoundId: fit.compoundId,
      targetId: fit.target,
      computedBy: null,
    });
    return {
      slot: Number(fit.compoundId),
      target_slot: TARGET_SLOTS.indexOf(fit.target as (typeof TARGET_SLOTS)[number]),
      model: row.model,
      status: row.status,
      message: row.message,
      ic50_um: row.ic50_uM,
      ic50_ci_low_um: row.ic50CiLow_uM,
      ic50_ci_high_um: row.ic50CiHigh_uM,
      ic50_lower_bound_um: row.ic50LowerBound_uM,
      log10_ic50_se: row.log10Ic50Se,
      hill: row.hill,
      top: row.top,
      bottom: row.bottom,
      r2: row.r2,
      residual_sd: row.residualSd,
      n: row.n,
      flags: row.flags,
      estimate: row.estimate,
    };
  });
  return { wells, readouts, fits, qcSummary: analysis.targets };
}
