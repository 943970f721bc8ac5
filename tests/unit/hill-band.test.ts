import tQuantiles from '../fixtures/check-values/student-t-quantiles.json';
import { describe, expect, test } from 'vitest';
import { hillBand } from '@/lib/science/fit/hill-band';
import { fitHill } from '@/lib/science/fit/hill-fit';

describe('confidence band of a Hill fit', () => {
  // Generated data with known truth (IC50 1 µM, slope 1) plus fixed alternating offsets of ±0.03.
  const c = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];
  const block = c.map((x, i) => 1 / (1 + 1 / x) + (i % 2 === 0 ? 0.03 : -0.03));
  const fit = fitHill({ concentration_uM: c, block });
  const e = fit.estimate!;

  test('the band surrounds the fitted curve and is narrowest near the data centre', () => {
    const band = hillBand('hill2', e.parameters, e.covariance, e.degreesOfFreedom, [0.001, 1, 1000]);
    for (const point of band) {
      expect(point.low!).toBeLessThanOrEqual(point.block);
      expect(point.high!).toBeGreaterThanOrEqual(point.block);
    }
    // At C = IC50 the hill2 curve is 0.5 by definition of IC50.
    const atIc50 = hillBand('hill2', e.parameters, e.covariance, e.degreesOfFreedom, [e.ic50_uM])[0]!;
    expect(atIc50.block).toBeCloseTo(0.5, 12);
  });

  test('at C = IC50 the half-width is t·SE(log10 IC50)·(n·ln10/4), the delta method worked by hand', () => {
    // For hill2, ∂f/∂log10IC50 at C = IC50 is −n·ln10·s(1−s) = −n·ln10/4 and ∂f/∂n is 0 there,
    // so Var f = (n·ln10/4)²·Var(log10 IC50). t from jStat; worked by hand (no outside source).
    const [point] = hillBand('hill2', e.parameters, e.covariance, e.degreesOfFreedom, [e.ic50_uM]);
    // t₀.₉₇₅ with 6 degrees of freedom (student-t-quantiles.json; standard t tables: 2.447).
    const t = tQuantiles.quantiles.find(
      (q) => q.probability === 0.975 && q.degreesOfFreedom === e.degreesOfFreedom,
    )!.t;
    const expected = (t * e.log10Ic50Se! * (e.hillSlope * Math.LN10)) / 4;
    expect(point!.high! - point!.block).toBeCloseTo(expected, 8);
  });

  test('without a covariance there is no band', () => {
    const [point] = hillBand('hill2', e.parameters, null, e.degreesOfFreedom, [1]);
    expect(point!.low).toBeNull();
  });
});
