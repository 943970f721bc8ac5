// Least-squares Hill fit with standard errors, confidence interval and goodness of fit (no status rules).
import jStat from 'jstat';
import { sumNthPowerDeviations } from 'simple-statistics';
import { fitLeastSquares, type LeastSquaresStop } from './levenberg-marquardt';
import { hillCurveModel } from './hill-model';
import type { ResolvedHillFitOptions } from './hill-options';
import { concentrationLevels, hillSearchBox, hillStartValues } from './hill-start';
import { cellClusterCovariance, pointsShareCells } from './cell-clusters';

/**
 * Stopping tolerances for Hill fits: looser than the optimiser's defaults (which serve reference
 * problems such as NIST StRD), still far below the standard errors of any real curve (Gatewell choice).
 */
const HILL_TOLERANCES = { rssTolerance: 1e-12, stepTolerance: 1e-10, gradientTolerance: 1e-10 } as const;

export interface HillCurveEstimate {
  converged: boolean;
  stop: LeastSquaresStop;
  iterations: number;
  /** log10(IC50 / µM). */
  log10Ic50: number;
  /**
   * Standard error of log10 IC50 from `covariance`; null when it cannot be formed.
   */
  log10Ic50Se: number | null;
  ic50_uM: number;
  /** 95 % interval 10^(log10 IC50 ± t₀.₉₇₅,ν · SE), ν = `degreesOfFreedom` (µM); null without an SE or when it overflows. */
  ic50Ci95_uM: [number, number] | null;
  hillSlope: number;
  hillSlopeSe: number | null;
  /** Fitted for hill4; fixed 0 (SE null) for hill2. */
  bottom: number;
  bottomSe: number | null;
  /** Fitted for hill4; fixed 1 (SE null) for hill2. */
  top: number;
  topSe: number | null;
  /** Residual sum of squares (block², compensated sum). */
  rss: number;
  /** 1 − RSS/TSS; null when every block value is equal. */
  r2: number | null;
  /** √(RSS/(n − p)); null when n ≤ p. */
  residualSd: number | null;
  /** Points used. */
  n: number;
  /** Degrees of freedom of the t quantile of the intervals and bands: n − p, or G − 1 with cells as the unit. */
  degreesOfFreedom: number;
  /**
   * The unit the intervals treat as independent: 'point' (s²(JᵀJ)⁻¹ on n − p degrees of freedom), or
   * 'cell' where points share cells (cumulative application; the cluster-robust covariance on G − 1,
   * `cell-clusters.ts`).
   */
  intervalUnit: 'point' | 'cell';
  /** G, the cells behind a 'cell' interval; null for 'point'. */
  cells: number | null;
  /** log10 IC50 ended on the edge of its search range: the data do not place it. */
  ic50AtSearchEdge: boolean;
  hillSlopeAtBound: boolean;
  /** Free parameters in fitting order [log10 IC50, Hill slope, (bottom, top)], for curves and bands. */
  parameters: number[];
  /** Covariance of the free parameters (s²(JᵀJ)⁻¹, or cluster-robust by cell); null when it cannot be formed. */
  covariance: number[][] | null;
}

/**
 * Fits the Hill equation to the given points (all used; concentrations ≥ 0 µM, at least one > 0,
 * block finite). Start values and search box come from the data, so the fit is deterministic.
 * `cells` names the cell of each point: where some cell holds several points (cumulative application),
 * the intervals take the cell as the unit (`cell-clusters.ts`); the estimates are the same either way.
 */
export function fitHillCurve(
  concentration_uM: ArrayLike<number>,
  block: ArrayLike<number>,
  options: ResolvedHillFitOptions,
  cells?: ArrayLike<string>,
): HillCurveEstimate {
  const levels = concentrationLevels(concentration_uM, block);
  if (levels.length === 0) throw new RangeError('a Hill fit needs at least one concentration above 0');
  const box = hillSearchBox(levels, options);
  const x = Float64Array.from(concentration_uM, (c) => Math.log10(c));
  const fit = fitLeastSquares(hillCurveModel(options.model), x, block, {
    initial: hillStartValues(levels, options, box),
    lower: box.lower,
    upper: box.upper,
    maxIterations: options.maxIterations,
    ...HILL_TOLERANCES,
  });
  const [log10Ic50, hillSlope, bottom = 0, top = 1] = fit.parameters as [number, number, number?, number?];
  const nu = fit.degreesOfFreedom;
  const byCell = pointsShareCells(cells);
  // With cells as the unit and fewer than two cells (or no usable covariance) there is no interval.
  const clustered =
    byCell && fit.converged
      ? cellClusterCovariance(hillCurveModel(options.model), x, block, fit.parameters, cells!)
      : null;
  const covariance = byCell ? (clustered?.covariance ?? null) : fit.covariance;
  const intervalNu = byCell ? (clustered?.degreesOfFreedom ?? 0) : nu;
  const se = (j: number): number | null => {
    const v = covariance?.[j]?.[j];
    return v === undefined ? null : Math.sqrt(v);
  };
  const log10Ic50Se = se(0);
  const t = intervalNu > 0 ? jStat.studentt.inv(0.975, intervalNu) : NaN;
  const tss = sumNthPowerDeviations(Array.from(block), 2);
  const edge = (j: number) =>
    nearBound(fit.parameters[j]!, box.lower[j]!) || nearBound(fit.parameters[j]!, box.upper[j]!);
  return {
    converged: fit.converged,
    stop: fit.stop,
    iterations: fit.iterations,
    log10Ic50,
    log10Ic50Se,
    ic50_uM: 10 ** log10Ic50,
    ic50Ci95_uM: interval95(log10Ic50, log10Ic50Se, t),
    hillSlope,
    hillSlopeSe: se(1),
    bottom,
    bottomSe: options.model === 'hill4' ? se(2) : null,
    top,
    topSe: options.model === 'hill4' ? se(3) : null,
    rss: fit.rss,
    r2: tss > 0 ? 1 - fit.rss / tss : null,
    residualSd: nu > 0 ? Math.sqrt(fit.rss / nu) : null,
    n: block.length,
    degreesOfFreedom: intervalNu,
    intervalUnit: byCell ? 'cell' : 'point',
    cells: byCell ? (clustered?.cells ?? null) : null,
    ic50AtSearchEdge: edge(0),
    hillSlopeAtBound: edge(1),
    parameters: [...fit.parameters],
    covariance,
  };
}

/** 10^(log10 IC50 ± t·SE), or null when there is no SE or the interval leaves the representable range (µM). */
function interval95(log10Ic50: number, se: number | null, t: number): [number, number] | null {
  if (se === null || !Number.isFinite(t)) return null;
  const low = 10 ** (log10Ic50 - t * se);
  const high = 10 ** (log10Ic50 + t * se);
  return low > 0 && Number.isFinite(high) ? [low, high] : null;
}

function nearBound(value: number, bound: number): boolean {
  return Math.abs(value - bound) <= 1e-6 * Math.max(1, Math.abs(bound));
}
