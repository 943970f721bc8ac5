// Gatewell's Levenberg–Marquardt optimiser against NIST StRD nonlinear regression certified values.
import { describe, expect, test } from 'vitest';
import { fitLeastSquares, type CurveModel } from '@/lib/science/fit/levenberg-marquardt';

// NIST StRD Rat42 (Ratkowsky 1983): y = b1/(1 + exp(b2 − b3·x)).
const rat42: CurveModel = {
  parameterCount: 3,
  evaluate(x, b, gradient) {
    const e = Math.exp(b[1]! - b[2]! * x);
    const f = b[0]! / (1 + e);
    if (gradient) {
      gradient[0] = 1 / (1 + e);
      gradient[1] = (-b[0]! * e) / (1 + e) ** 2;
      gradient[2] = (b[0]! * e * x) / (1 + e) ** 2;
    }
    return f;
  },
};

// NIST StRD Rat43 (Ratkowsky 1983): y = b1/(1 + exp(b2 − b3·x))^(1/b4).
const rat43: CurveModel = {
  parameterCount: 4,
  evaluate(x, b, gradient) {
    const e = Math.exp(b[1]! - b[2]! * x);
    const base = 1 + e;
    const power = 1 / b[3]!;
    const f = b[0]! * base ** -power;
    if (gradient) {
      const inner = b[0]! * power * base ** (-power - 1) * e;
      gradient[0] = base ** -power;
      gradient[1] = -inner;
      gradient[2] = inner * x;
      gradient[3] = f * Math.log(base) * power * power;
    }
    return f;
  },
};

// NIST StRD Rat42 data and certified values.
const RAT42 = {
  x: [9, 14, 21, 28, 42, 57, 63, 70, 79],
  y: [8.93, 10.8, 18.59, 22.33, 39.35, 56.11, 61.73, 64.62, 67.08],
  starts: [
    [100, 1, 0.1],
    [75, 2.5, 0.07],
  ],
  b: [7.2462237576e1, 2.6180768402, 6.7359200066e-2],
  sd: [1.7340283401, 8.8295217536e-2, 3.4465663377e-3],
  rss: 8.0565229338,
  residualSd: 1.1587725499,
  df: 6,
};

// NIST StRD Rat43 data and certified values.
const RAT43 = {
  x: Array.from({ length: 15 }, (_, i) => i + 1),
  y: [16.08, 33.83, 65.8, 97.2, 191.55, 326.2, 386.87, 520.53, 590.03, 651.92, 724.93, 699.56, 689.96, 637.56, 717.41],
  starts: [
    [100, 10, 1, 1],
    [700, 5, 0.75, 1.3],
  ],
  b: [6.996415127e2, 5.2771253025, 7.5962938329e-1, 1.2792483859],
  sd: [1.6302297817e1, 2.0828735829, 1.9566123451e-1, 6.8761936385e-1],
  rss: 8.786404908e3,
  residualSd: 2.8262414662e1,
  df: 11,
};

const relative = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe.each([
  ['Rat42', rat42, RAT42],
  ['Rat43', rat43, RAT43],
] as const)('NIST StRD %s', (_name, model, data) => {
  test.each(data.starts.map((start, i) => [i + 1, start] as const))('from start %i reaches the certified values', (_i, start) => {
    const fit = fitLeastSquares(model, data.x, data.y, { initial: start });
    expect(fit.converged).toBe(true);
    expect(fit.degreesOfFreedom).toBe(data.df);
    fit.parameters.forEach((b, j) => expect(relative(b, data.b[j]!)).toBeLessThan(1e-6));
    fit.standardErrors!.forEach((sd, j) => expect(relative(sd, data.sd[j]!)).toBeLessThan(1e-5));
    expect(relative(fit.rss, data.rss)).toBeLessThan(1e-9);
    expect(relative(Math.sqrt(fit.rss / fit.degreesOfFreedom), data.residualSd)).toBeLessThan(1e-9);
  });
});

describe('bounds and inputs', () => {
  test('an upper bound below the optimum holds the parameter on the bound and fits the rest', () => {
    // Certified Rat42 b1 = 72.46; capped at 70 the estimate must sit on 70 and the RSS must exceed the certified 8.0565.
    const fit = fitLeastSquares(rat42, RAT42.x, RAT42.y, { initial: [60, 1, 0.1], upper: [70, Infinity, Infinity] });
    expect(fit.converged).toBe(true);
    expect(fit.parameters[0]).toBe(70);
    expect(fit.rss).toBeGreaterThan(RAT42.rss);
  });

  test('inputs are not mutated', () => {
    const start = Float64Array.from([100, 1, 0.1]);
    const y = Float64Array.from(RAT42.y);
    fitLeastSquares(rat42, RAT42.x, y, { initial: start });
    expect(Array.from(start)).toEqual([100, 1, 0.1]);
    expect(Array.from(y)).toEqual(RAT42.y);
  });

  test.each([
    [{ initial: [1, 2] }, 'initial must have 3 values, got 2'],
    [{ initial: [100, 1, 0.1], lower: [0, 0, 0.2] }, 'initial[2] = 0.1 lies outside [0.2, Infinity]'],
    [{ initial: [100, 1, 0.1], maxIterations: 0 }, 'maxIterations must be a positive integer, got 0'],
  ])('rejects bad options: %j', (options, message) => {
    expect(() => fitLeastSquares(rat42, RAT42.x, RAT42.y, options)).toThrow(message);
  });

  test('stops at the iteration cap and says it did not converge', () => {
    const fit = fitLeastSquares(rat43, RAT43.x, RAT43.y, { initial: RAT43.starts[0]!, maxIterations: 3 });
    expect(fit).toMatchObject({ converged: false, stop: 'max_iterations', covariance: null, standardErrors: null });
  });
});
