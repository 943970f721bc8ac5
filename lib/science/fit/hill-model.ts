// The Hill equation for fractional block and its analytic gradient, as a model for the optimiser.
import type { CurveModel } from './least-squares-model';

/** 'hill2': bottom 0 and top 1 fixed, log10 IC50 and Hill slope free; 'hill4': all four free. */
export type HillModelName = 'hill2' | 'hill4';

/** Free parameters in fitting order: [log10 IC50 (µM), Hill slope, bottom, top]; hill2 uses the first two. */
export const HILL_PARAMETER_COUNT: Readonly<Record<HillModelName, number>> = { hill2: 2, hill4: 4 };

/**
 * Fractional block at a concentration by the Hill equation,
 * block(C) = bottom + (top − bottom)/(1 + (IC50/C)^n); with bottom 0 and top 1 this is the simple
 * pore-block formula of Mirams et al. 2011 (Cardiovasc Res 91:53–61).
 * @param concentration_uM concentration C (µM), ≥ 0; at C = 0 the block is `bottom` (for n > 0).
 * @param ic50_uM IC50 (µM), > 0.
 * @param hillSlope Hill slope n (dimensionless).
 * @param bottom block as C → 0 (fraction). @default 0
 * @param top block as C → ∞ (fraction). @default 1
 */
export function hillBlock(
  concentration_uM: number,
  ic50_uM: number,
  hillSlope: number,
  bottom = 0,
  top = 1,
): number {
  if (concentration_uM === 0) return hillSlope > 0 ? bottom : hillSlope < 0 ? top : (bottom + top) / 2;
  const exponent = hillSlope * (Math.log10(ic50_uM) - Math.log10(concentration_uM)) * Math.LN10;
  const s = exponent > 0 ? Math.exp(-exponent) / (1 + Math.exp(-exponent)) : 1 / (1 + Math.exp(exponent));
  return bottom + (top - bottom) * s;
}

/**
 * The Hill equation on x = log10(C / µM) (x = −∞ for C = 0), parameters as in {@link HILL_PARAMETER_COUNT}.
 * Written in exponent form so that no intermediate overflows at extreme concentrations.
 */
export function hillCurveModel(model: HillModelName): CurveModel {
  const four = model === 'hill4';
  return {
    parameterCount: HILL_PARAMETER_COUNT[model],
    evaluate(x, parameters, gradient) {
      const log10Ic50 = parameters[0]!;
      const slope = parameters[1]!;
      const bottom = four ? parameters[2]! : 0;
      const top = four ? parameters[3]! : 1;
      let s: number;
      let dsdLog10Ic50 = 0;
      let dsdSlope = 0;
      if (x === -Infinity) {
        s = slope > 0 ? 0 : slope < 0 ? 1 : 0.5;
      } else {
        // s = 1/(1 + eᵉ) with e = n·(log10 IC50 − x)·ln 10; ds/de = −s(1 − s), each factor formed without cancellation.
        const distance = log10Ic50 - x;
        const exponent = slope * distance * Math.LN10;
        let complement: number;
        if (exponent > 0) {
          const w = Math.exp(-exponent);
          s = w / (1 + w);
          complement = 1 / (1 + w);
        } else {
          const u = Math.exp(exponent);
          s = 1 / (1 + u);
          complement = u / (1 + u);
        }
        const q = s * complement;
        dsdLog10Ic50 = -slope * Math.LN10 * q;
        dsdSlope = -distance * Math.LN10 * q;
      }
      if (gradient) {
        gradient[0] = (top - bottom) * dsdLog10Ic50;
        gradient[1] = (top - bottom) * dsdSlope;
        if (four) {
          gradient[2] = 1 - s;
          gradient[3] = s;
        }
      }
      return bottom + (top - bottom) * s;
    },
  };
}
