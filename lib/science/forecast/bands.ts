import type { Excitability, ExcitabilityRequest } from '../neuron/excitability';
import {
  bandOf,
  type Band,
  type BandCellResult,
  type BandMeasure,
  type BandTask,
  type BandWay,
} from './band-cell';
import type { ForecastPlan } from './plan';
import { poreBlockFraction } from './pore-block';
import { seededRandom } from './prng';
import { nearFiringTransition, type FiringTransition, type TransitionTask } from './firing-transition';
import { drawPotency, type DrawSource } from './uncertainty';

export { bandOf, quantileSorted, type Band, type BandSample, type BandTask } from './band-cell';
export { DEFAULT_BAND_DRAWS, type BandRequest } from './band-request';

export interface ConditionBand {
  concentration: number | null;
  /** Band of the fraction blocked, per conductance. */
  block: Record<string, Band>;
  rheobase_uA_cm2: Band;
  threshold_mV: Band;
  referenceRate_Hz: Band;
  /** How each measure's band was found (band-cell.ts). */
  ways?: Record<BandMeasure, BandWay>;
  /** Model runs the band took beside the point forecast. */
  runs?: number;
  /** Its concentration lies within the firing transition's band, or its rate band's low end is under half its high end. */
  nearTransition?: boolean;
}

export interface ForecastBands {
  draws: number;
  seed: number;
  level: 0.95;
  sources: { conductance: string; source: DrawSource; note: string }[];
  /** Per condition (same order as the forecast's); null where no band was asked for. */
  conditions: (ConditionBand | null)[];
  method: string;
  /** Where the compound stops the cell firing repetitively at the reference drive, with its band. */
  transition?: FiringTransition | null;
}

export const BAND_METHOD =
  'Each fit’s log IC50 and Hill slope drawn jointly (normal or t with the fit’s covariance, else a bootstrap of its wells); median and 2.5–97.5 % quantiles of the draws’ rheobase, threshold and rate at each concentration, the model run at the quantile points of the draws ordered by block where every run agrees with that order, else per draw.';

/** The band work of a planned forecast: one task per banded condition, made once that condition is measured. */
export interface BandWork {
  /** Indices of the banded conditions. */
  conditions: number[];
  /** The task of condition `index`, given the point forecast's measurement of it. */
  task(index: number, measured: Excitability): BandTask;
  /** The firing transition's task, given the control and every condition measured. */
  transitionTask(control: Excitability, conditions: Excitability[]): TransitionTask;
  assemble(results: Map<number, BandCellResult>, transition: FiringTransition | null): ForecastBands;
}

/**
 * Plans the bands: draws every used potency's parameters (seeded, in conductance-name order) and turns
 * each draw into a block per drawn conductance at each banded concentration. Each concentration's task
 * uses the control's reference drive and starts its rheobase search at that condition's own rheobase
 * (the point forecast's), and carries the point forecast's measures at the estimate (band-cell.ts).
 */
export function planBands(plan: ForecastPlan, control: Excitability): BandWork | null {
  const bands = plan.bands;
  if (!bands || !plan.potencies) return null;
  const random = seededRandom(bands.seed);
  const names = Object.keys(plan.potencies).sort();
  const drawn = names.map((name) =>
    drawPotency(name, plan.potencies![name]!, bands.potencies[name], bands.draws, random),
  );
  const wanted = (c: number | null) =>
    bands.concentrations === null ||
    (c !== null && bands.concentrations.some((w) => Math.abs(w - c) <= 1e-9 * Math.max(w, c)));
  const conditions = plan.conditions.flatMap((c, i) => (wanted(c.concentration) ? [i] : []));
  const bandRequest: ExcitabilityRequest = {
    protocol: {
      dt_ms: plan.protocol.dt_ms,
      rates: plan.protocol.rates,
      rheobaseStep_ms: plan.protocol.rheobaseStep_ms,
      rheobaseRelTolerance: plan.protocol.rheobaseRelTolerance,
      rheobaseCeiling_uA_cm2: plan.protocol.rheobaseCeiling_uA_cm2,
      rateStep_ms: plan.protocol.rateStep_ms,
      thresholdSlope_mV_ms: plan.protocol.thresholdSlope_mV_ms,
      thresholdStepFactor: plan.protocol.thresholdStepFactor,
    },
    drives_uA_cm2: [],
    referenceDrive_uA_cm2: control.referenceDrive_uA_cm2 ?? undefined,
  };
  const fixedScaleOf = (scale: Record<string, number>) =>
    Object.fromEntries(Object.entries(scale).filter(([name]) => !names.includes(name)));
  const blocksAt = (concentration: number | null) =>
    drawn.map((d) =>
      Array.from({ length: bands.draws }, (_, i) =>
        concentration === null ? 0 : poreBlockFraction(concentration, 10 ** d.log10Ic50[i]!, d.hill[i]!),
      ),
    );
  return {
    conditions,
    task(index, measured) {
      const c = plan.conditions[index]!;
      const fixedScale = fixedScaleOf(c.scale);
      const request: ExcitabilityRequest = {
        ...bandRequest,
        rheobaseGuess_uA_cm2: measured.rheobase_uA_cm2 ?? control.rheobase_uA_cm2 ?? undefined,
      };
      return {
        kind: 'band',
        preset: plan.preset,
        request,
        names,
        blocks: blocksAt(c.concentration),
        fixedScale,
        inactivationShift: c.inactivationShift,
        center: {
          block: names.map((name) => c.block[name] ?? 0),
          sample: {
            rheobase_uA_cm2: measured.rheobase_uA_cm2,
            threshold_mV: measured.threshold_mV,
            rate_Hz: measured.reference?.rate_Hz ?? null,
          },
        },
      };
    },
    transitionTask(ctrl, measured) {
      const points = plan.conditions
        .map((c, i) => ({
          concentration: c.concentration ?? 0,
          rate_Hz: measured[i]!.reference?.rate_Hz ?? 0,
        }))
        .sort((a, b) => a.concentration - b.concentration);
      return {
        kind: 'transition',
        preset: plan.preset,
        request: bandRequest,
        fixedScale: fixedScaleOf(plan.conditions[0]?.scale ?? {}),
        potencies: plan.potencies!,
        measured: [{ concentration: 0, rate_Hz: ctrl.reference?.rate_Hz ?? 0 }, ...points],
        draws: Object.fromEntries(
          drawn.map((d) => [d.conductance, { log10Ic50: [...d.log10Ic50], hill: [...d.hill] }]),
        ),
      };
    },
    assemble(results, transition) {
      return {
        transition,
        draws: bands.draws,
        seed: bands.seed,
        level: 0.95,
        sources: drawn.map((d) => ({ conductance: d.conductance, source: d.source, note: d.note })),
        method: BAND_METHOD,
        conditions: plan.conditions.map((c, ci) => {
          const r = results.get(ci);
          if (!r) return null;
          return {
            concentration: c.concentration,
            block: Object.fromEntries(
              drawn.map((d, k) => [d.conductance, bandOf(blocksAt(c.concentration)[k]!, 'omit')]),
            ),
            rheobase_uA_cm2: r.rheobase_uA_cm2,
            threshold_mV: r.threshold_mV,
            referenceRate_Hz: r.rate_Hz,
            ways: r.ways,
            runs: r.runs,
            nearTransition: nearFiringTransition(c.concentration, transition, r.rate_Hz),
          };
        }),
      };
    },
  };
}
