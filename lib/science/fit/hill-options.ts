// Options of the Hill fit, checked and defaulted in one place.
import type { HillModelName } from './hill-model';

/** A closed interval [low, high]. */
export type Interval = readonly [number, number];

export interface HillFitOptions {
  /** @default 'hill2' (bottom 0 and top 1 fixed; Gatewell design, section 5) */
  model?: HillModelName;
  /**
   * Below this mean block at every tested concentration the compound is inactive (fraction).
   * @default 0.2 (common practice, no source)
   */
  inactiveBlock?: number;
  /**
   * Mean block at the highest concentration below this means "IC50 above the highest concentration
   * tested" (fraction). @default 0.5 (by definition of IC50)
   */
  aboveRangeBlock?: number;
  /** Hill slopes outside this band are flagged. @default [0.5, 2] (common practice, no source) */
  hillSlopeBand?: Interval;
  /** Fewer distinct concentrations than this give no fit. @default 3 for hill2, 4 for hill4 (one per free parameter, at least 3) */
  minConcentrations?: number;
  /**
   * Search range of log10 IC50: this many decades beyond the lowest and highest tested concentration.
   * An estimate on the edge of the range is reported as not converged. @default 3 (Gatewell default, no source)
   */
  searchDecades?: number;
  /** Bounds on the free parameters; each replaces its default. */
  bounds?: {
    /** @default [0.05, 10] (Gatewell default, no source) */
    hillSlope?: Interval;
    /** hill4 only (fraction). @default [−0.5, 0.5] (Gatewell default, no source) */
    bottom?: Interval;
    /** hill4 only (fraction). @default [0.5, 1.5] (Gatewell default, no source) */
    top?: Interval;
  };
  /** Optimiser iterations before "not converged". @default 200 */
  maxIterations?: number;
}

export interface ResolvedHillFitOptions {
  model: HillModelName;
  inactiveBlock: number;
  aboveRangeBlock: number;
  hillSlopeBand: Interval;
  minConcentrations: number;
  searchDecades: number;
  hillSlopeBounds: Interval;
  bottomBounds: Interval;
  topBounds: Interval;
  maxIterations: number;
}

/** Fills defaults and checks every option; throws RangeError naming the option at fault. */
export function resolveHillFitOptions(options: HillFitOptions = {}): ResolvedHillFitOptions {
  const model = options.model ?? 'hill2';
  if (model !== 'hill2' && model !== 'hill4')
    throw new RangeError(`model must be 'hill2' or 'hill4', got ${String(model)}`);
  const minConcentrations = options.minConcentrations ?? (model === 'hill4' ? 4 : 3);
  if (!Number.isInteger(minConcentrations) || minConcentrations < 3) {
    throw new RangeError(`minConcentrations must be an integer ≥ 3, got ${minConcentrations}`);
  }
  const maxIterations = options.maxIterations ?? 200;
  if (!Number.isInteger(maxIterations) || maxIterations < 1) {
    throw new RangeError(`maxIterations must be a positive integer, got ${maxIterations}`);
  }
  return {
    model,
    inactiveBlock: finite('inactiveBlock', options.inactiveBlock, 0.2),
    aboveRangeBlock: finite('aboveRangeBlock', options.aboveRangeBlock, 0.5),
    hillSlopeBand: interval('hillSlopeBand', options.hillSlopeBand, [0.5, 2]),
    minConcentrations,
    searchDecades: finite('searchDecades', options.searchDecades, 3, 0),
    hillSlopeBounds: interval('bounds.hillSlope', options.bounds?.hillSlope, [0.05, 10]),
    bottomBounds: interval('bounds.bottom', options.bounds?.bottom, [-0.5, 0.5]),
    topBounds: interval('bounds.top', options.bounds?.top, [0.5, 1.5]),
    maxIterations,
  };
}

function finite(name: string, value: number | undefined, fallback: number, exclusiveMin = -Infinity): number {
  if (value === undefined) return fallback;
  if (!Number.isFinite(value) || !(value > exclusiveMin))
    throw new RangeError(
      `${name} must be a finite number${exclusiveMin > -Infinity ? ` > ${exclusiveMin}` : ''}, got ${value}`,
    );
  return value;
}

function interval(name: string, value: Interval | undefined, fallback: Interval): Interval {
  if (value === undefined) return fallback;
  const [low, high] = value;
  if (!Number.isFinite(low) || !Number.isFinite(high) || !(low < high)) {
    throw new RangeError(`${name} must be [low, high] with finite low < high, got [${low}, ${high}]`);
  }
  return [low, high];
}
