import { DEFAULT_DT_MS, simulate, type IntegratorOptions } from './integrate';
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
  /**
   * First relative step of the bracketing from the guess (then doubled each step): small when the guess
   * is known to be close, e.g. a neighbouring draw's rheobase. The answer's tolerance is the same.
   * @default 0.25
   */
  firstGrowth?: number;
  /**
   * Search first with this multiple of dt, then confirm (and if need be move) the bracket at dt.
   * The answer holds at dt to the stated tolerance either way; 1 searches at dt only. At 4 (0.1 ms
   * by default) the coarse answer is close enough that the check at dt mostly costs two runs.
   * @default 4
   */
  coarseDtFactor?: number;
  thresholdSlope_mV_ms?: number;
  spikeLevel_mV?: number;
}

export interface RheobaseResult {
  /** Smallest step current found to give a spike (upper end of the final bracket), or null. */
  rheobase_uA_cm2: number | null;
  /** Final bracket at dt: lo gave no spike, hi gave one (lo = 0 is not simulated). */
  bracket: [number, number] | null;
  /** Threshold (mV) of the first spike at the rheobase step. */
  threshold_mV: number | null;
  /** Latency (ms) of that spike from step onset. */
  latency_ms: number | null;
  /** Steps simulated (coarse and fine). */
  steps: number;
}

interface Firing {
  threshold_mV: number | null;
  latency_ms: number;
}

type Fire = (current: number) => Firing | null;

/**
 * Bracket outward from `guess` with growth factors 1 + first·2^k (few steps near the guess, quick far
 * from it), then bisect until (hi − lo) ≤ max(relTol·hi, absTol). Null if nothing fires up to the ceiling.
 */
function search(fire: Fire, guess: number, first: number, relTol: number, absTol: number, ceiling: number) {
  const growth = (k: number) => 1 + first * 2 ** k;
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
      if (lo >= ceiling) return null;
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
  return { lo, hi, atHi };
}

/**
 * Rheobase: the smallest step current from `rest` that gives at least one spike within the step,
 * by bracketing outward from a guess and bisection to the stated tolerance. The search runs at a
 * coarser step first; its answer is then bracketed again at dt starting from a bracket of the
 * tolerance's width, which costs two runs when the coarse answer is already right. Assumes that
 * firing within the step is monotone in the current (true of both built-in presets).
 */
export function findRheobase(
  model: CompiledModel,
  rest: MembraneState,
  options: RheobaseOptions = {},
): RheobaseResult {
  const stepMs = options.step_ms ?? 500;
  const relTol = options.relTolerance ?? 1e-3;
  const absTol = options.absTolerance_uA_cm2 ?? 1e-4;
  const ceiling = options.ceiling_uA_cm2 ?? 200;
  const dt = options.dt_ms ?? DEFAULT_DT_MS;
  const factor = options.coarseDtFactor ?? 4;
  let steps = 0;
  const fireAt =
    (dt_ms: number): Fire =>
    (current) => {
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
        { dt_ms, rates: options.rates },
      );
      const t = run.spikeTimes_ms[0];
      return t === undefined ? null : { threshold_mV: run.firstSpikeThreshold_mV, latency_ms: t };
    };
  const guess = Math.min(Math.max(options.guess_uA_cm2 ?? 1, absTol), ceiling);
  const first = options.firstGrowth ?? 0.25;
  let found: ReturnType<typeof search>;
  if (factor > 1) {
    const coarse = search(fireAt(dt * factor), guess, first, relTol, absTol, ceiling);
    found = search(fireAt(dt), coarse?.hi ?? ceiling, relTol, relTol, absTol, ceiling);
  } else {
    found = search(fireAt(dt), guess, first, relTol, absTol, ceiling);
  }
  if (!found) return { rheobase_uA_cm2: null, bracket: null, threshold_mV: null, latency_ms: null, steps };
  return {
    rheobase_uA_cm2: found.hi,
    bracket: [found.lo, found.hi],
    threshold_mV: found.atHi?.threshold_mV ?? null,
    latency_ms: found.atHi?.latency_ms ?? null,
    steps,
  };
}
