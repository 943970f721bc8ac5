import type { Excitability, ExcitabilityRequest } from '../neuron/excitability';
import type { NeuronPreset } from '../neuron/types';
import type { ForecastPlan } from './plan';
import { poreBlockFraction } from './pore-block';
import { seededRandom } from './prng';
import { drawPotency, type DrawSource, type PotencyUncertaintyInput } from './uncertainty';

/** Bands asked for in a forecast request (validated by request-schema.ts). */
export interface BandRequest {
  draws: number;
  seed: number;
  /** Per conductance of `potencies`: the fit's covariance and/or wells; absent means none known. */
  potencies: Record<string, PotencyUncertaintyInput>;
  /** Concentrations to band (same unit as the request's); null: every one. */
  concentrations: number[] | null;
}

export const DEFAULT_BAND_DRAWS = 200;

/** One draw's measures at one concentration. */
export interface BandSample {
  rheobase_uA_cm2: number | null;
  threshold_mV: number | null;
  rate_Hz: number | null;
}

/** Many blocked models of one preset under one request: one measurement per scale map. */
export interface BandTask {
  kind: 'band';
  preset: NeuronPreset;
  request: ExcitabilityRequest;
  scales: Record<string, number>[];
}

/** Median and 2.5–97.5 % quantiles of a measure over the draws; null where undefined (see `missing`). */
export interface Band {
  median: number | null;
  low: number | null;
  high: number | null;
  /** Draws without a value: for rheobase no spike up to the ceiling (counted as above every value). */
  missing: number;
}

export interface ConditionBand {
  concentration: number | null;
  /** Band of the fraction blocked, per conductance. */
  block: Record<string, Band>;
  rheobase_uA_cm2: Band;
  threshold_mV: Band;
  referenceRate_Hz: Band;
}

export interface ForecastBands {
  draws: number;
  seed: number;
  level: 0.95;
  sources: { conductance: string; source: DrawSource; note: string }[];
  /** Per condition (same order as the forecast's); null where no band was asked for. */
  conditions: (ConditionBand | null)[];
  method: string;
}

export const BAND_METHOD =
  'Each fit’s log IC50 and Hill slope drawn jointly (normal with the fit’s covariance, else a bootstrap of its wells), the model run per draw at each concentration; median and 2.5–97.5 % quantiles of the draws.';

/** Quantile of sorted values by linear interpolation (Hyndman & Fan 1996, type 7); ∞ gives null. */
export function quantileSorted(sorted: readonly number[], p: number): number | null {
  if (sorted.length === 0) return null;
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.ceil(h);
  const a = sorted[lo]!;
  const b = sorted[hi]!;
  const q = lo === hi ? a : a + (h - lo) * (b - a);
  return Number.isFinite(q) ? q : null;
}

/** Band of values; `nullAs` says how a missing value counts (above all, or left out). */
export function bandOf(values: readonly (number | null)[], nullAs: 'infinity' | 'omit'): Band {
  const missing = values.filter((v) => v === null).length;
  const kept = values
    .map((v) => (v === null ? (nullAs === 'infinity' ? Number.POSITIVE_INFINITY : null) : v))
    .filter((v): v is number => v !== null)
    .sort((a, b) => a - b);
  return {
    median: quantileSorted(kept, 0.5),
    low: quantileSorted(kept, 0.025),
    high: quantileSorted(kept, 0.975),
    missing,
  };
}

/** The band work of a planned forecast: tasks to run (any order, any thread) and how to put the answers together. */
export interface BandWork {
  tasks: BandTask[];
  assemble(results: BandSample[][]): ForecastBands;
}

/**
 * Plans the bands: draws every used potency's parameters (seeded, in conductance-name order), turns each
 * draw into a block map per concentration, and groups the distinct maps of each concentration into tasks
 * of at most `chunk` measurements (identical maps are measured once). Each measurement uses the
 * control's reference drive and starts its rheobase search at the control's rheobase, as the point
 * forecast's conditions do.
 */
export function planBands(plan: ForecastPlan, control: Excitability, chunk = 64): BandWork | null {
  const bands = plan.bands;
  if (!bands || !plan.potencies) return null;
  const random = seededRandom(bands.seed);
  const names = Object.keys(plan.potencies).sort();
  const drawn = names.map((name) =>
    drawPotency(name, plan.potencies![name]!, bands.potencies[name], bands.draws, random),
  );
  const blockable = plan.preset.conductances.filter((c) => c.blockable).map((c) => c.name);
  const wanted = (c: number | null) =>
    bands.concentrations === null ||
    (c !== null && bands.concentrations.some((w) => Math.abs(w - c) <= 1e-9 * Math.max(w, c)));
  // Per condition: the block of each drawn conductance per draw, the distinct scale maps and each draw's map index.
  const layout = plan.conditions.map((c) => {
    if (!wanted(c.concentration)) return { blocks: [], scales: [], index: new Int32Array(0) };
    const blocks = drawn.map((d) =>
      Float64Array.from({ length: bands.draws }, (_, i) =>
        c.concentration === null ? 0 : poreBlockFraction(c.concentration, 10 ** d.log10Ic50[i]!, d.hill[i]!),
      ),
    );
    const distinct = new Map<string, number>();
    const scales: Record<string, number>[] = [];
    const index = new Int32Array(bands.draws);
    for (let i = 0; i < bands.draws; i++) {
      const scale = Object.fromEntries(
        blockable.map((name) => {
          const k = names.indexOf(name);
          return [name, k < 0 ? (c.scale[name] ?? 1) : 1 - blocks[k]![i]!];
        }),
      );
      const key = JSON.stringify(scale);
      let at = distinct.get(key);
      if (at === undefined) {
        at = scales.length;
        distinct.set(key, at);
        scales.push(scale);
      }
      index[i] = at;
    }
    return { blocks, scales, index };
  });
  const tasks: BandTask[] = [];
  const owners: { condition: number; from: number }[] = [];
  layout.forEach((l, ci) => {
    // The same start as the point forecast's conditions (conditionTasks), so that a draw equal to the
    // estimate measures exactly the point forecast.
    const guess = control.rheobase_uA_cm2 ?? undefined;
    const request: ExcitabilityRequest = {
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
      rheobaseGuess_uA_cm2: guess,
    };
    for (let from = 0; from < l.scales.length; from += chunk) {
      tasks.push({ kind: 'band', preset: plan.preset, request, scales: l.scales.slice(from, from + chunk) });
      owners.push({ condition: ci, from });
    }
  });
  return {
    tasks,
    assemble(results) {
      const measured = layout.map((l) => new Array<BandSample>(l.scales.length));
      results.forEach((samples, t) => {
        const o = owners[t]!;
        samples.forEach((s, k) => (measured[o.condition]![o.from + k] = s));
      });
      return {
        draws: bands.draws,
        seed: bands.seed,
        level: 0.95,
        sources: drawn.map((d) => ({ conductance: d.conductance, source: d.source, note: d.note })),
        method: BAND_METHOD,
        conditions: plan.conditions.map((c, ci) => {
          const l = layout[ci]!;
          if (!wanted(c.concentration)) return null;
          const perDraw = Array.from(l.index, (k) => measured[ci]![k]!);
          return {
            concentration: c.concentration,
            block: Object.fromEntries(
              drawn.map((d, k) => [d.conductance, bandOf([...l.blocks[k]!], 'omit')]),
            ),
            rheobase_uA_cm2: bandOf(
              perDraw.map((s) => s.rheobase_uA_cm2),
              'infinity',
            ),
            threshold_mV: bandOf(
              perDraw.map((s) => s.threshold_mV),
              'omit',
            ),
            referenceRate_Hz: bandOf(
              perDraw.map((s) => s.rate_Hz),
              'omit',
            ),
          };
        }),
      };
    },
  };
}
