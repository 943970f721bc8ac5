// The Hill block formula against the pore-block worked values of Mirams et al. 2011
// (tests/fixtures/check-values/pore-block-mirams-2011.json).
import poreBlock from '../fixtures/check-values/pore-block-mirams-2011.json';
import { expect, test } from 'vitest';
import { hillBlock, hillCurveModel } from '@/lib/science/fit/hill-model';

// Mirams et al. 2011, Cardiovasc Res 91:53–61: block = 1/(1 + (IC50/C)^h), at this test's own IC50
// and slope (the slope only where the worked value holds for any slope).
const chosen: Record<string, { ic50_uM: number; h: number }> = {
  'C = IC50': { ic50_uM: 2.5, h: 1 },
  'h = 1, C = 10·IC50': { ic50_uM: 0.7, h: 1 },
  'h = 2, C = IC50/3': { ic50_uM: 4, h: 2 },
  'C = 0': { ic50_uM: 3, h: 1.3 },
};
test.each(
  poreBlock.workedValues.map((w) => {
    const { ic50_uM, h } = chosen[w.case]!;
    return [w.case, w.concentrationOverIc50 * ic50_uM, ic50_uM, w.hillSlope ?? h, w.blockFraction] as const;
  }),
)('%s', (_case, concentration_uM, ic50_uM, h, expected) => {
  expect(hillBlock(concentration_uM, ic50_uM, h)).toBeCloseTo(expected, 6);
  // The fitting model (on log10 C) gives the same value.
  const model = hillCurveModel('hill2');
  expect(
    model.evaluate(Math.log10(concentration_uM), Float64Array.from([Math.log10(ic50_uM), h])),
  ).toBeCloseTo(expected, 6);
});

test('analytic gradient of the fitting model matches central differences', () => {
  // Check of our own derivation against numerical differentiation (no outside value needed).
  const model = hillCurveModel('hill4');
  const p = Float64Array.from([0.3, 1.4, 0.05, 0.92]);
  const gradient = new Float64Array(4);
  for (const x of [-2, -0.5, 0.3, 1, 2.5]) {
    model.evaluate(x, p, gradient);
    for (let j = 0; j < 4; j++) {
      const up = Float64Array.from(p);
      const down = Float64Array.from(p);
      up[j] = up[j]! + 1e-6;
      down[j] = down[j]! - 1e-6;
      const numeric = (model.evaluate(x, up) - model.evaluate(x, down)) / 2e-6;
      expect(gradient[j]).toBeCloseTo(numeric, 7);
    }
  }
});

test('no overflow far from the IC50', () => {
  // At 10^300-fold above or below the IC50 block is 1 or 0, never NaN.
  expect(hillBlock(1e150, 1e-150, 1)).toBe(1);
  expect(hillBlock(1e-150, 1e150, 1)).toBeCloseTo(0, 12);
  const g = new Float64Array(2);
  expect(hillCurveModel('hill2').evaluate(-300, Float64Array.from([300, 2]), g)).toBe(0); // 10^−1200 underflows to 0
  expect(Array.from(g).every(Number.isFinite)).toBe(true);
});
