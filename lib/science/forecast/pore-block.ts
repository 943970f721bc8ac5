/**
 * Simple pore block (Mirams et al. 2011, Cardiovasc Res 91:53–61): the fraction of a conductance
 * blocked at concentration C is b = 1 / (1 + (IC50 / C)^h), and the model runs with g·(1 − b).
 * C and IC50 in the same unit; C = 0 gives 0, C = ∞ gives 1.
 */
export function poreBlockFraction(concentration: number, ic50: number, hillSlope: number): number {
  if (!(ic50 > 0) || !Number.isFinite(ic50))
    throw new RangeError(`IC50 must be a positive finite number, got ${ic50}`);
  if (!(hillSlope > 0) || !Number.isFinite(hillSlope))
    throw new RangeError(`Hill slope must be a positive finite number, got ${hillSlope}`);
  if (!(concentration >= 0)) throw new RangeError(`concentration must be ≥ 0, got ${concentration}`);
  if (concentration === 0) return 0;
  if (concentration === Number.POSITIVE_INFINITY) return 1;
  return 1 / (1 + (ic50 / concentration) ** hillSlope);
}
