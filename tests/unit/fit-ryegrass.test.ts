// Gatewell's four-parameter Hill fit against a published dose-response analysis (ryegrass, drc).
import { describe, expect, test } from 'vitest';
import { fitHillCurve } from '@/lib/science/fit/hill-curve';
import { resolveHillFitOptions } from '@/lib/science/fit/hill-options';

// Inderjit, Streibig & Olofsdotter 2002, Physiol Plant 114:422–428: ferulic acid (mM) vs ryegrass root
// length (cm), 24 observations, as distributed with the R package drc.
const conc = [0, 0, 0, 0, 0, 0, 0.94, 0.94, 0.94, 1.88, 1.88, 1.88, 3.75, 3.75, 3.75, 7.5, 7.5, 7.5, 15, 15, 15, 30, 30, 30];
const rootLength = [
  7.58, 8, 8.328571429, 7.25, 7.375, 7.9625, 8.355555556, 6.914285714, 7.75, 6.871428571, 6.45, 5.922222222, 1.925,
  2.885714286, 4.233333333, 1.1875, 0.857142857, 1.057142857, 0.6875, 0.525, 0.825, 0.25, 0.22, 0.44,
];

// drc documentation, four-parameter log-logistic f(x) = c + (d − c)/(1 + exp(b(ln x − ln e))).
// Gatewell's Hill form bottom + (top − bottom)/(1 + (IC50/C)^n) is the same curve with
// n = −b, bottom = c, top = d, IC50 = e.
const DRC = {
  b: { estimate: 2.98222, se: 0.46506 },
  c: { estimate: 0.48141, se: 0.21219 },
  d: { estimate: 7.79296, se: 0.18857 },
  e: { estimate: 3.05795, se: 0.18573 },
  residualSe: 0.5196256,
  df: 20,
  rss: 5.400215,
};

describe('ryegrass four-parameter fit (drc estimates)', () => {
  // Root length falls with concentration: a negative Hill slope and wide bounds on bottom and top.
  const options = resolveHillFitOptions({ model: 'hill4', bounds: { hillSlope: [-20, -0.05], bottom: [-100, 100], top: [-100, 100] } });
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
