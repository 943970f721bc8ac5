// Gatewell's four-parameter Hill fit against a published dose-response analysis (ryegrass, drc).
// Data and estimates with their sources: tests/fixtures/check-values/ryegrass.json.
import ryegrass from '../fixtures/check-values/ryegrass.json';
import { describe, expect, test } from 'vitest';
import { fitHillCurve } from '@/lib/science/fit/hill-curve';
import { resolveHillFitOptions } from '@/lib/science/fit/hill-options';

// Inderjit, Streibig & Olofsdotter 2002, Physiol Plant 114:422–428: ferulic acid (mM) vs ryegrass root
// length (cm), 24 observations, as distributed with the R package drc.
const conc = ryegrass.concentration_mM;
const rootLength = ryegrass.rootLength_cm;

// drc documentation, four-parameter log-logistic f(x) = c + (d − c)/(1 + exp(b(ln x − ln e))).
// Gatewell's Hill form bottom + (top − bottom)/(1 + (IC50/C)^n) is the same curve with
// n = −b, bottom = c, top = d, IC50 = e.
const drc = ryegrass.drcLogLogistic4;
const DRC = {
  b: { estimate: drc.b_slope.estimate, se: drc.b_slope.standardError },
  c: { estimate: drc.c_lower_cm.estimate, se: drc.c_lower_cm.standardError },
  d: { estimate: drc.d_upper_cm.estimate, se: drc.d_upper_cm.standardError },
  e: { estimate: drc.e_ed50_mM.estimate, se: drc.e_ed50_mM.standardError },
  residualSe: drc.residualStandardError_cm,
  df: drc.degreesOfFreedom,
  rss: drc.residualSumOfSquares_cm2,
};

describe('ryegrass four-parameter fit (drc estimates)', () => {
  // Root length falls with concentration: a negative Hill slope and wide bounds on bottom and top.
  const options = resolveHillFitOptions({
    model: 'hill4',
    bounds: { hillSlope: [-20, -0.05], bottom: [-100, 100], top: [-100, 100] },
  });
  const fit = fitHillCurve(conc, rootLength, options);
  const within = (actual: number, expected: number, fraction: number) =>
    expect(Math.abs(actual - expected)).toBeLessThanOrEqual(fraction * Math.abs(expected));

  test('estimates agree with drc to its printed precision', () => {
    expect(fit.converged).toBe(true);
    within(-fit.hillSlope, DRC.b.estimate, 1e-5);
    within(fit.bottom, DRC.c.estimate, 1e-5);
    within(fit.top, DRC.d.estimate, 1e-5);
    within(fit.ic50_uM, DRC.e.estimate, 1e-5);
  });

  test('residual SE, RSS and degrees of freedom agree with drc', () => {
    expect(fit.degreesOfFreedom).toBe(DRC.df);
    within(fit.residualSd!, DRC.residualSe, 1e-6);
    within(fit.rss, DRC.rss, 1e-6);
  });

  test('standard errors agree with drc within 3 % (s²(JᵀJ)⁻¹ differs slightly from drc)', () => {
    within(fit.hillSlopeSe!, DRC.b.se, 0.03);
    within(fit.bottomSe!, DRC.c.se, 0.03);
    within(fit.topSe!, DRC.d.se, 0.03);
    // SE of e from the SE of log10 e by the delta method: SE(e) = e · ln 10 · SE(log10 e).
    within(fit.ic50_uM * Math.LN10 * fit.log10Ic50Se!, DRC.e.se, 0.03);
  });
});
