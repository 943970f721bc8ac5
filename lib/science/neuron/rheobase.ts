import { simulate, type IntegratorOptions } from './integrate';
import { steadyStateAt, type CompiledModel } from './model';
import { stableFixedPointAbove } from './steady-state';
import type { MembraneState } from './types';

export interface RheobaseOptions extends IntegratorOptions {
  /** Step length (ms). @default 500 */
  step_ms?: number;
  /** Stop when (hi − lo) ≤ relTolerance·hi. @default 1e-3 (0.1 %) */
  relTolerance?: number;
  /** Absolute floor on the tolerance (µA/cm²). @default 1e-4 */
  absTolerance_uA_cm2?: number;
  /** Largest step tried before reporting no firing (µA/cm²). @default 200 */
  ceiling_uA_cm2?: number;
  /** First current tried; the control rheobase is a good guess for a blocked condition. @default 1 */
  guess_uA_cm2?: number;
  thresholdSlope_mV_ms?: number;
  spikeLevel_mV?: number;
}

export interface RheobaseResult {
  /** Smallest step current found to give a spike (upper end of the final bracket), or null. */
  rheobase_uA_cm2: number | null;
  /** Final bracket: lo gave no spike, hi gave one. */
  bracket: [number, number] | null;
  /** Threshold (mV) of the first spike at the rheobase step. */
  threshold_mV: number | null;
  /** Latency (ms) of that spike from step onset. */
  latency_ms: number | null;
  steps: number;
}

/** Bracket growth: ×1.25, ×1.5, ×2, ×3, ×5 … from the guess (few steps near it, quick far from it). */
const growth = (k: number) => 1 + 0.25 * 2 ** k;

interface Firing {
  threshold_mV: number | null;
  latency_ms: number;
}

/**
 * Rheobase: the smallest step current from `rest` that gives at least one spike within the step,
 * by bracketing outward from a guess and then bisection to the stated tolerance. Assumes that
 * firing within the step is monotone in the current (true of both built-in presets).
 */
export function findRheobase(model: CompiledModel, rest: MembraneState, options: RheobaseOptions = {}): RheobaseResult {
  const stepMs = options.step_ms ?? 500;
  const relTol = options.relTolerance ?? 1e-3;
  const absTol = options.absTolerance_uA_cm2 ?? 1e-4;
  const ceiling = options.ceiling_uA_cm2 ?? 200;
  let steps = 0;
  const fire = (current: number): Firing | null => {
    steps++;
    // A sub-threshold step ends at a stable fixed point; stop there rather than run the whole step.
    const target = stableFixedPointAbove(model, current, rest.v_mV);
    const run = simulate(
      model,
      rest,
      {
        current_uA_cm2: current,
        duration_ms: stepMs,
        stopAtFirstSpike: true,
        thresholdSlope_mV_ms: options.thresholdSlope_mV_ms,
        spikeLevel_mV: options.spikeLevel_mV,
        settleAt: target ? steadyStateAt(model, target.v_mV) : undefined,
      },
      options,
    );
    const t = run.spikeTimes_ms[0];
    return t === undefined ? null : { threshold_mV: run.firstSpikeThreshold_mV, latency_ms: t };
  };
  const guess = Math.min(Math.max(options.guess_uA_cm2 ?? 1, absTol), ceiling);
  let lo = 0;
  let hi = guess;
  let atHi = fire(guess);
  if (atHi) {
    for (let k = 0; ; k++) {
      const c = hi / growth(k);
      if (c < absTol) break;
      const r = fire(c);
      if (!r) {
        lo = c;
        break;
      }
      hi = c;
      atHi = r;
    }
  } else {
    lo = guess;
    for (let k = 0; !atHi; k++) {
      if (lo >= ceiling) return { rheobase_uA_cm2: null, bracket: null, threshold_mV: null, latency_ms: null, steps };
      hi = Math.min(lo * growth(k), ceiling);
      atHi = fire(hi);
      if (!atHi) lo = hi;
    }
  }
  while (hi - lo > Math.max(relTol * hi, absTol)) {
    const mid = 0.5 * (lo + hi);
    const r = fire(mid);
    if (r) {
      hi = mid;
      atHi = r;
    } else lo = mid;
  }
  return { rheobase_uA_cm2: hi, bracket: [lo, hi], threshold_mV: atHi?.threshold_mV ?? null, latency_ms: atHi?.latency_ms ?? null, steps };
}
