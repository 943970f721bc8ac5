// Z′ factor, its bands and the plate limit. Published values: tests/fixtures/check-values/zprime-zhang-1999.json.
import zhang from '../fixtures/check-values/zprime-zhang-1999.json';
import { describe, expect, test } from 'vitest';
import { plateZPrime, zPrimeBand, zPrimeFromStatistics } from '@/lib/science/qc/zprime';

describe('Z′ (Zhang, Chung & Oldenburg 1999, J Biomol Screen 4:67–73)', () => {
  test('worked case: μp 100, σp 5, μn 10, σn 5 gives Z′ = 0.6667 (zprime-zhang-1999.json)', () => {
    // Zhang et al. 1999 worked case, Z′ = 1 − 3(5 + 5)/|100 − 10| = 0.6667.
    const { positive, negative, zPrime } = zhang.workedCase;
    expect(zPrimeFromStatistics(positive, negative)).toBeCloseTo(zPrime, 4);
  });

  // Zhang et al. 1999 bands (zprime-zhang-1999.json): 0.5 ≤ Z′ < 1 excellent (1 ideal), 0 < Z′ < 0.5 marginal,
  // Z′ ≤ 0 unusable. Each band's edges, and a point 1e-4 inside the next band.
  const { excellent, marginal, unusable } = zhang.bands;
  test.each([
    [excellent.max_inclusive, 'excellent'],
    [excellent.min_inclusive, 'excellent'],
    [marginal.max_exclusive - 1e-4, 'marginal'],
    [marginal.min_exclusive + 1e-4, 'marginal'],
    [unusable.max_inclusive, 'unusable'],
    [-2, 'unusable'],
  ] as const)('Z′ %f is %s', (z, band) => {
    expect(zPrimeBand(z)).toBe(band);
  });

  test('from well values: sample SDs of the reference and vehicle wells', () => {
    // Reference block 0.9, 1.0, 1.1 (mean 1, sample SD 0.1); vehicle −0.05, 0, 0.05 (mean 0, SD 0.05):
    // Z′ = 1 − 3(0.1 + 0.05)/1 = 0.55, by hand.
    const result = plateZPrime([0.9, 1.0, 1.1], [-0.05, 0, 0.05]);
    expect(result.zPrime).toBeCloseTo(0.55, 12);
    // The default limit is the Z′ > 0.5 usually required (zprime-zhang-1999.json).
    expect(result).toMatchObject({ band: 'excellent', passes: true, limit: zhang.usuallyRequiredMinimum });
    expect(result.reference).toMatchObject({ n: 3 });
    expect(result.reference.sd).toBeCloseTo(0.1, 12);
  });

  test('below the screen limit the plate fails and says so', () => {
    const result = plateZPrime([0.9, 1.0, 1.1], [-0.05, 0, 0.05], 0.6);
    expect(result.passes).toBe(false);
    expect(result.message).toBe("Z′ 0.55 (excellent) is below the screen's limit of 0.6.");
  });

  test.each([
    [[1], [0, 0.1], 'Z′ needs at least 2 reference and 2 vehicle wells; 1 and 2 in use.'],
    [[0.5, 0.5], [0.4, 0.6], 'Reference and vehicle wells have the same mean: no assay window.'],
  ])('no Z′ when it cannot be formed: %j vs %j', (reference, vehicle, message) => {
    const result = plateZPrime(reference, vehicle);
    expect(result.zPrime).toBeNull();
    expect(result.passes).toBe(false);
    expect(result.message).toBe(message);
  });
});
