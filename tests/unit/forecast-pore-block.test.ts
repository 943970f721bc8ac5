// Pore block and the conductance scaling it drives (Mirams et al. 2011, Cardiovasc Res 91:53–61;
// worked values in tests/fixtures/check-values/pore-block-mirams-2011.json).
import poreBlock from '../fixtures/check-values/pore-block-mirams-2011.json';
import { describe, expect, test } from 'vitest';
import { planForecast } from '@/lib/science/forecast/plan';
import { poreBlockFraction } from '@/lib/science/forecast/pore-block';
import { parseForecastRequest } from '@/lib/science/forecast/request-schema';

describe('poreBlockFraction', () => {
  // Worked values from pore-block-mirams-2011.json, at this test's own IC50 (and slope, where any slope holds).
  const ic50ByCase: Record<string, number> = {
    'C = IC50': 3,
    'h = 1, C = 10·IC50': 1,
    'h = 2, C = IC50/3': 1,
    'C = 0': 1,
  };
  test.each(
    poreBlock.workedValues.map((w) => {
      const ic50 = ic50ByCase[w.case]!;
      return [w.case, w.concentrationOverIc50 * ic50, ic50, w.hillSlope ?? 1, w.blockFraction] as const;
    }),
  )('%s → %s', (_label, c, ic50, h, expected) => {
    expect(poreBlockFraction(c, ic50, h)).toBeCloseTo(expected, 6);
  });

  test('infinite concentration blocks fully', () => {
    expect(poreBlockFraction(Number.POSITIVE_INFINITY, 1, 1)).toBe(1);
  });

  test.each([
    [1, 0, 1, 'IC50 must be a positive finite number'],
    [1, -2, 1, 'IC50 must be a positive finite number'],
    [1, 1, 0, 'Hill slope must be a positive finite number'],
    [-1, 1, 1, 'concentration must be ≥ 0'],
    [Number.NaN, 1, 1, 'concentration must be ≥ 0'],
  ])('rejects C = %s, IC50 = %s, h = %s', (c, ic50, h, message) => {
    expect(() => poreBlockFraction(c, ic50, h)).toThrow(message);
  });
});

test('potencies and concentrations give g·(1 − b) per conductance', () => {
  const plan = planForecast(
    parseForecastRequest({
      preset: 'hh-squid-1952',
      potencies: { gNa: { ic50: 2, hill: 1 }, gK: { ic50: 3, hill: 2 } },
      concentrations: [0, 2, 20],
    }),
  );
  expect(plan.conditions.map((c) => c.concentration)).toEqual([0, 2, 20]);
  // gNa: C = IC50 → 0.5; C = 10·IC50, h = 1 → 0.909091 (pore-block-mirams-2011.json).
  // gK: C = 2/3·IC50, h = 2 → 1/(1 + 2.25) = 0.307692 (the formula worked by hand).
  const worked = (label: string) => poreBlock.workedValues.find((w) => w.case === label)!.blockFraction;
  expect(plan.conditions[1]!.block.gNa).toBeCloseTo(worked('C = IC50'), 12);
  expect(plan.conditions[2]!.block.gNa).toBeCloseTo(worked('h = 1, C = 10·IC50'), 6);
  expect(plan.conditions[1]!.block.gK).toBeCloseTo(1 / (1 + 2.25), 12);
  expect(plan.conditions[0]!.scale).toEqual({ gNa: 1, gK: 1 });
  expect(plan.conditions[1]!.scale.gNa).toBeCloseTo(1 - worked('C = IC50'), 12);
});
