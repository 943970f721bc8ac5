// Pore block and the conductance scaling it drives (Mirams et al. 2011, Cardiovasc Res 91:53–61).
import { describe, expect, test } from 'vitest';
import { planForecast } from '@/lib/science/forecast/plan';
import { poreBlockFraction } from '@/lib/science/forecast/pore-block';
import { parseForecastRequest } from '@/lib/science/forecast/request-schema';

describe('poreBlockFraction', () => {
  // Worked values from CHECK-VALUES.md.
  test.each([
    ['C = IC50', 3, 3, 1, 0.5],
    ['h = 1, C = 10·IC50', 10, 1, 1, 0.909091],
    ['h = 2, C = IC50/3', 1 / 3, 1, 2, 0.1],
    ['C = 0', 0, 1, 1, 0],
  ])('%s → %s', (_label, c, ic50, h, expected) => {
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
  // gNa: C = IC50 → 0.5; C = 10·IC50, h = 1 → 0.909091. gK: C = 2/3·IC50, h = 2 → 1/(1 + 2.25) = 0.307692.
  expect(plan.conditions[1]!.block.gNa).toBeCloseTo(0.5, 12);
  expect(plan.conditions[2]!.block.gNa).toBeCloseTo(0.909091, 6);
  expect(plan.conditions[1]!.block.gK).toBeCloseTo(1 / (1 + 2.25), 12);
  expect(plan.conditions[0]!.scale).toEqual({ gNa: 1, gK: 1 });
  expect(plan.conditions[1]!.scale.gNa).toBeCloseTo(0.5, 12);
});
