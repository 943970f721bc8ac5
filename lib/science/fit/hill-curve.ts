// Least-squares Hill fit with standard errors, confidence interval and goodness of fit (no status rules).
import jStat from 'jstat';
import { sumNthPowerDeviations } from 'simple-statistics';
import { fitLeastSquares, type LeastSquaresStop } from './levenberg-marquardt';
import { hillCurveModel } from './hill-model';
import type { ResolvedHillFitOptions } from './hill-options';
import { concentrationLevels, hillSearchBox, hillStartValues } from './hill-start';

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
  /** Standard error of log10 IC50 from s²(JᵀJ)⁻¹; null when it cannot be formed. */
  log10Ic50Se: number | null;
  ic50_uM: number;
  /** 95 % interval 10^(log10 IC50 ± t₀.₉₇₅,ν · SE), ν = n − p (µM); null without an SE or when it overflows. */
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
  degreesOfFreedom: number;
  /** log10 IC50 ended on the edge of its search range: the data do not place it. */
  ic50AtSearchEdge: boolean;
  hillSlopeAtBound: boolean;
  /** Free parameters in fitting order [log10 IC50, Hill slope, (bottom, top)], for curves and bands. */
  parameters: number[];
  /** s²(JᵀJ)⁻¹ of the free parameters; null when it cannot be formed. */
  covariance: number[][] | null;
}

/**
 * Fits the Hill equation to the given points (all used; concentrations ≥ 0 µM, at least one > 0,
 * block finite). Start values and search box come from the data, so the fit is deterministic.
 */
export function fitHillCurve(
  concentration_uM: ArrayLike<number>,
  block: ArrayLike<number>,
  options: ResolvedHillFitOptions,
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
  const se = (j: number): number | null => fit.standardErrors?.[j] ?? null;
  const log10Ic50Se = se(0);
  const nu = fit.degreesOfFreedom;
  const t = nu > 0 ? jStat.studentt.inv(0.975, nu) : NaN;
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
    degreesOfFreedom: nu,
    ic50AtSearchEdge: edge(0),
    hillSlopeAtBound: edge(1),
    parameters: [...fit.parameters],
    covariance: fit.covariance,
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
