import type { ExcitabilityRequest } from '../neuron/excitability';
import type { NeuronPreset } from '../neuron/types';
import { inactivationSlope_mV, modulatedReceptorShift_mV } from '../neuron/state-dependent-block';
import { measureSample, quantileSorted } from './band-cell';
import { poreBlockFraction } from './pore-block';

/**
 * Where a compound stops the cell firing repetitively at the forecast's reference drive (twice the
 * control rheobase): the lowest concentration at which the rate there (taken over the last half of the
 * step, so 0 Hz means at most a few spikes at onset) falls to 0, with the block of each conductance there.
 */
export interface FiringTransition {
  /**
   * 'found'; 'silent-at-control': the control itself does not fire repetitively at that drive (nothing
   * to lose); 'fires-throughout': it still fires at TRANSITION_SEARCH_FACTOR × the highest concentration.
   */
  status: 'found' | 'silent-at-control' | 'fires-throughout';
  /** Concentration at the estimate's potencies (the request's unit), and the block there per conductance. */
  concentration: number | null;
  block: Record<string, number> | null;
  /** 2.5 %, 50 % and 97.5 % of the transition concentration over the bands' draws; null without bands. */
  band: { low: number; median: number; high: number } | null;
  note: string;
}

/** How far above the highest forecast concentration the search goes (our choice, no source). */
export const TRANSITION_SEARCH_FACTOR = 1000;
/** The bisection stops when the bracket is within this ratio of concentration (our choice, no source). */
export const TRANSITION_REL_TOLERANCE = 0.005;

export interface TransitionTask {
  kind: 'transition';
  preset: NeuronPreset;
  /** Reference drive and protocol as for the bands (band-cell.ts). */
  request: ExcitabilityRequest;
  /** Multiplier of every blockable conductance without a potency. */
  fixedScale: Record<string, number>;
  /** IC50 (Kr), Hill slope and, for state-dependent block, the inactivated-state IC50 (Ki) per conductance. */
  potencies: Record<string, TransitionPotency>;
  /** Concentrations measured by the point forecast (ascending) and the reference rate at each, control first. */
  measured: { concentration: number; rate_Hz: number }[];
  /** The bands' draws (log10 IC50 and Hill slope per conductance), or null. */
  draws: Record<string, { log10Ic50: number[]; hill: number[] }> | null;
}

export interface TransitionPotency {
  ic50: number;
  hill: number;
  inactivatedIc50?: number;
}

function blockAt(potencies: Record<string, TransitionPotency>, c: number): Record<string, number> {
  return Object.fromEntries(
    Object.entries(potencies).map(([name, p]) => [name, poreBlockFraction(c, p.ic50, p.hill)]),
  );
}

/** Rate at the reference drive with these potencies at concentration c (the rate alone is run). */
function rateAt(task: TransitionTask, potencies: TransitionTask['potencies'], c: number): number {
  const scale = { ...task.fixedScale };
  for (const [name, b] of Object.entries(blockAt(potencies, c))) scale[name] = 1 - b;
  return (
    measureSample(task.preset, scale, task.request, true, shiftAt(task.preset, potencies, c)).rate_Hz ?? 0
  );
}

/** Inactivation shift (mV) of each state-dependently blocked conductance at concentration c (plan.ts does the same). */
function shiftAt(
  preset: NeuronPreset,
  potencies: TransitionTask['potencies'],
  c: number,
): Record<string, number> {
  return Object.fromEntries(
    Object.entries(potencies).flatMap(([name, p]) => {
      const k = inactivationSlope_mV(preset, name);
      if (p.inactivatedIc50 === undefined || k === null) return [];
      return [[name, modulatedReceptorShift_mV(c, p.ic50, p.inactivatedIc50, k)]];
    }),
  );
}

/**
 * Lowest concentration (within the tolerance) where the rate is 0, for one set of potencies: bracketed by
 * the measured concentrations when given, else by factors of 10 above `from`; bisected in log
 * concentration. Null when the rate stays above 0 up to `ceiling`.
 */
export function transitionConcentration(
  task: TransitionTask,
  potencies: TransitionTask['potencies'],
  bracket: { firing: number; silent: number | null },
  ceiling: number,
): number | null {
  let lo = bracket.firing;
  let hi = bracket.silent;
  if (hi === null) {
    // Make sure the low end fires (a draw's guess may not).
    for (let k = 0; k < 6 && rateAt(task, potencies, lo) === 0; k++) {
      hi = lo;
      lo /= 10;
    }
  }
  if (hi === null) {
    let c = Math.max(lo, 1e-12) * 10;
    while (c <= ceiling * (1 + 1e-9)) {
      if (rateAt(task, potencies, c) === 0) break;
      lo = c;
      c *= 10;
    }
    if (c > ceiling * (1 + 1e-9)) return null;
    hi = c;
  }
  if (lo <= 0) lo = hi / 1e6;
  while (hi / lo > 1 + TRANSITION_REL_TOLERANCE) {
    const mid = Math.sqrt(lo * hi);
    if (rateAt(task, potencies, mid) === 0) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** Potencies of draw i (an inactivated-state IC50 kept as estimated: no fit uncertainty is given for it). */
function drawPotencies(
  draws: NonNullable<TransitionTask['draws']>,
  estimate: TransitionTask['potencies'],
  i: number,
): TransitionTask['potencies'] {
  return Object.fromEntries(
    Object.entries(draws).map(([name, d]) => [
      name,
      { ...estimate[name], ic50: 10 ** d.log10Ic50[i]!, hill: d.hill[i]! },
    ]),
  );
}

/**
 * The firing transition at the estimate and, given the draws, its band. With one conductance the rate
 * depends on the draw only through that block, so every draw stops firing at the estimate's transition
 * block b, at c = IC50 · (b / (1 − b))^(1/h) (the Hill equation solved for c): the band needs no model run.
 * With several, the draws are ordered by the concentration at which their most blocked conductance (at the
 * estimate's transition) reaches its block there, and the transition is bisected for the draws at the 2.5,
 * 50 and 97.5 % places of that order (an approximation: tests/unit/forecast-firing-transition.test.ts
 * compares it with a bisection per draw). State-dependent block (a potency with inactivatedIc50) takes
 * the second way too, its inactivation shift worked out at each concentration tried.
 */
export function findFiringTransition(task: TransitionTask): FiringTransition {
  const control = task.measured[0];
  if (!control || control.rate_Hz === 0) {
    return {
      status: 'silent-at-control',
      concentration: null,
      block: null,
      band: null,
      note: 'The control does not fire repetitively at the reference drive, so there is no firing to lose.',
    };
  }
  const highest = Math.max(...task.measured.map((m) => m.concentration));
  const ceiling = TRANSITION_SEARCH_FACTOR * highest;
  const firstSilent = task.measured.findIndex((m) => m.rate_Hz === 0);
  const bracket =
    firstSilent > 0
      ? {
          firing: task.measured[firstSilent - 1]!.concentration,
          silent: task.measured[firstSilent]!.concentration,
        }
      : { firing: highest, silent: null };
  const c = transitionConcentration(task, task.potencies, bracket, ceiling);
  if (c === null) {
    return {
      status: 'fires-throughout',
      concentration: null,
      block: null,
      band: null,
      note: `Still fires repetitively at ${TRANSITION_SEARCH_FACTOR} × the highest concentration forecast.`,
    };
  }
  const block = blockAt(task.potencies, c);
  let band: FiringTransition['band'] = null;
  const draws = task.draws;
  const names = Object.keys(task.potencies).sort();
  if (draws && names.every((n) => draws[n])) {
    const n = draws[names[0]!]!.hill.length;
    // The conductance most blocked at the transition orders the draws.
    const primary = names.reduce((a, b) => (block[b]! > block[a]! ? b : a));
    const bStar = block[primary]!;
    const reach = (i: number) =>
      10 ** draws[primary]!.log10Ic50[i]! * (bStar / (1 - bStar)) ** (1 / draws[primary]!.hill[i]!);
    const byReach = Array.from({ length: n }, (_, i) => ({ i, c: reach(i) })).sort((a, b) => a.c - b.c);
    // State-dependent block also shifts inactivation with the concentration itself, so the rate is no
    // longer a function of the block alone: bisect at the quantile draws as for several conductances.
    const stateDependent = names.some((n) => task.potencies[n]!.inactivatedIc50 !== undefined);
    if (names.length === 1 && !stateDependent) {
      const sorted = byReach.map((r) => r.c);
      band = {
        low: quantileSorted(sorted, 0.025)!,
        median: quantileSorted(sorted, 0.5)!,
        high: quantileSorted(sorted, 0.975)!,
      };
    } else {
      const at = [0.025, 0.5, 0.975].map((p) => {
        const d = byReach[Math.round((n - 1) * p)]!;
        const found = transitionConcentration(
          task,
          drawPotencies(draws, task.potencies, d.i),
          { firing: d.c / 4, silent: null },
          ceiling,
        );
        return found ?? Number.POSITIVE_INFINITY;
      });
      const sorted = [...at].sort((a, b) => a - b);
      band = { low: sorted[0]!, median: sorted[1]!, high: sorted[2]! };
    }
  }
  return {
    status: 'found',
    concentration: c,
    block,
    band,
    note: 'Lowest concentration at which the cell no longer fires repetitively at the reference drive (twice the control rheobase).',
  };
}

/**
 * A forecast near the firing transition: its concentration lies within the transition's band, or its
 * rate band's low end is under half its high end (the rate changes by more than half within the band).
 */
export function nearFiringTransition(
  concentration: number | null,
  transition: FiringTransition | null,
  rateBand: { low: number | null; high: number | null } | null,
): boolean {
  const t = transition?.band;
  if (concentration !== null && t && concentration >= t.low && concentration <= t.high) return true;
  if (rateBand && rateBand.high !== null && rateBand.high > 0 && rateBand.low !== null)
    return rateBand.low < 0.5 * rateBand.high;
  return false;
}
