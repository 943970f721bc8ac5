// Gatewell's Levenberg–Marquardt optimiser against NIST StRD nonlinear regression certified values
// (tests/fixtures/check-values/nist-strd-rat42.json and nist-strd-rat43.json).
import rat42Data from '../fixtures/check-values/nist-strd-rat42.json';
import rat43Data from '../fixtures/check-values/nist-strd-rat43.json';
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

/** A NIST StRD data set and its certified values, from its fixture file. */
function certified(data: typeof rat42Data | typeof rat43Data) {
  return {
    x: data.x,
    y: data.y,
    starts: data.starts,
    b: data.certified.parameters,
    sd: data.certified.standardDeviations,
    rss: data.certified.residualSumOfSquares,
    residualSd: data.certified.residualStandardDeviation,
    df: data.certified.degreesOfFreedom,
  };
}

// NIST StRD Rat42 data and certified values (nist-strd-rat42.json).
const RAT42 = certified(rat42Data);

// NIST StRD Rat43 data and certified values (nist-strd-rat43.json).
const RAT43 = certified(rat43Data);

const relative = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe.each([
  ['Rat42', rat42, RAT42],
  ['Rat43', rat43, RAT43],
] as const)('NIST StRD %s', (_name, model, data) => {
  test.each(data.starts.map((start, i) => [i + 1, start] as const))(
    'from start %i reaches the certified values',
    (_i, start) => {
      const fit = fitLeastSquares(model, data.x, data.y, { initial: start });
      expect(fit.converged).toBe(true);
      expect(fit.degreesOfFreedom).toBe(data.df);
      fit.parameters.forEach((b, j) => expect(relative(b, data.b[j]!)).toBeLessThan(1e-6));
      fit.standardErrors!.forEach((sd, j) => expect(relative(sd, data.sd[j]!)).toBeLessThan(1e-5));
      expect(relative(fit.rss, data.rss)).toBeLessThan(1e-9);
      expect(relative(Math.sqrt(fit.rss / fit.degreesOfFreedom), data.residualSd)).toBeLessThan(1e-9);
    },
  );
});

describe('bounds and inputs', () => {
  test('an upper bound below the optimum holds the parameter on the bound and fits the rest', () => {
    // Certified Rat42 b1 = 72.46; capped at 70 the estimate must sit on 70 and the RSS must exceed the certified 8.0565
    // (nist-strd-rat42.json).
    const fit = fitLeastSquares(rat42, RAT42.x, RAT42.y, {
      initial: [60, 1, 0.1],
      upper: [70, Infinity, Infinity],
    });
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
    expect(fit).toMatchObject({
      converged: false,
      stop: 'max_iterations',
      covariance: null,
      standardErrors: null,
    });
  });
});
