// Pointwise 95 % confidence band of a fitted Hill curve by the delta method.
import jStat from 'jstat';
import { hillCurveModel, type HillModelName } from './hill-model';

export interface BandPoint {
  concentration_uM: number;
  block: number;
  /** Lower and upper 95 % limits; null without a covariance matrix. */
  low: number | null;
  high: number | null;
}

/**
 * The fitted curve and its pointwise 95 % band at each concentration:
 * f ± t₀.₉₇₅,ν · √(gᵀ Σ g), g = ∂f/∂θ at the estimates, Σ the parameters' covariance
 * (delta method; e.g. Seber & Wild, Nonlinear Regression, 1989, §5.1 — from memory).
 */
export function hillBand(
  model: HillModelName,
  parameters: readonly number[],
  covariance: readonly (readonly number[])[] | null,
  degreesOfFreedom: number,
  concentrations_uM: readonly number[],
): BandPoint[] {
  const curve = hillCurveModel(model);
  const p = curve.parameterCount;
  const theta = Float64Array.from(parameters.slice(0, p));
  const gradient = new Float64Array(p);
  const t = degreesOfFreedom > 0 ? jStat.studentt.inv(0.975, degreesOfFreedom) : NaN;
  return concentrations_uM.map((c) => {
    const block = curve.evaluate(Math.log10(c), theta, gradient);
    if (!covariance || !Number.isFinite(t)) return { concentration_uM: c, block, low: null, high: null };
    let variance = 0;
    for (let i = 0; i < p; i += 1)
      for (let j = 0; j < p; j += 1) variance += gradient[i]! * covariance[i]![j]! * gradient[j]!;
    const half = t * Math.sqrt(Math.max(variance, 0));
    return { concentration_uM: c, block, low: block - half, high: block + half };
  });
}

/** What a fitted curve and its band are drawn from: the estimates and the compound's tested range (µM). */
export interface CurveBasis {
  parameters: number[];
  covariance: number[][] | null;
  degreesOfFreedom: number;
  lowest_uM: number;
  highest_uM: number;
}

/** 121 log-spaced concentrations from a decade below to a decade above the tested range (µM; our choice, no source). */
export function curveGrid(lowest_uM: number, highest_uM: number): number[] {
  const from = Math.log10(lowest_uM) - 1;
  const to = Math.log10(highest_uM) + 1;
  return Array.from({ length: 121 }, (_, i) => 10 ** (from + ((to - from) * i) / 120));
}

/** The fitted curve and its 95 % band over `curveGrid` of the tested range; none without a basis. */
export function fitCurve(model: HillModelName, basis: CurveBasis | null): BandPoint[] {
  if (!basis) return [];
  return hillBand(
    model,
    basis.parameters,
    basis.covariance,
    basis.degreesOfFreedom,
    curveGrid(basis.lowest_uM, basis.highest_uM),
  );
}
