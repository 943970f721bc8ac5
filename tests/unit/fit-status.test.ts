// Every outcome of a Hill fit, table-driven: status, message, flags, excluded wells and replicates.
import { describe, expect, test } from 'vitest';
import { fitHill, type HillFitInput, type HillFitStatus } from '@/lib/science/fit/hill-fit';
import type { HillFitOptions } from '@/lib/science/fit/hill-options';
import { hillBlock } from '@/lib/science/fit/hill-model';

const SERIES_uM = [0.1, 0.3, 1, 3, 10, 30];
/** Noise-free hill2 block at the series above (values from the Hill equation, no fit involved). */
const curve = (ic50_uM: number, slope = 1, series = SERIES_uM): HillFitInput => ({
  concentration_uM: series,
  block: series.map((c) => hillBlock(c, ic50_uM, slope)),
});

describe('status of a fit', () => {
  test.each<[string, HillFitInput, HillFitOptions, HillFitStatus, string]>([
    [
      'two concentrations, replicated',
      { concentration_uM: [1, 1, 10, 10], block: [0.3, 0.32, 0.8, 0.82] },
      {},
      'insufficient',
      '2 distinct concentrations in use; a hill2 fit needs at least 3.',
    ],
    [
      'three concentrations, one of them excluded entirely',
      { concentration_uM: [1, 3, 10, 10], block: [0.3, 0.5, NaN, NaN], excluded: [false, false, true, true] },
      {},
      'insufficient',
      '2 distinct concentrations in use; a hill2 fit needs at least 3.',
    ],
    [
      'hill4 with three concentrations',
      curve(1, 1, [0.3, 1, 3]),
      { model: 'hill4' },
      'insufficient',
      '3 distinct concentrations in use; a hill4 fit needs at least 4.',
    ],
    [
      'no meaningful block',
      { concentration_uM: SERIES_uM, block: [0.01, -0.02, 0.03, 0.05, 0.08, 0.12] },
      {},
      'inactive',
      'No meaningful block: at most 12 % (at 30 µM), below the 20 % threshold.',
    ],
    [
      'block at the top concentration below 50 %',
      curve(60),
      {},
      'above_range',
      'IC50 above the highest concentration tested (> 30 µM): block at 30 µM is 33 %.',
    ],
    [
      'fitted IC50 above the top concentration (50 % rule lowered to 30 %)',
      curve(50),
      { aboveRangeBlock: 0.3 },
      'above_range',
      'IC50 above the highest concentration tested (> 30 µM): the fitted IC50 is 50 µM.',
    ],
    [
      'iteration limit',
      curve(2, 1.3),
      { maxIterations: 1 },
      'not_converged',
      'The fit did not converge (iteration limit reached after 1 iteration); no IC50 is reported.',
    ],
    [
      'IC50 driven to the edge of its search range',
      { concentration_uM: [0.1, 0.3, 1, 3], block: [0.98, 0.99, 1.0, 0.99] },
      { searchDecades: 0.5 },
      'not_converged',
      'The fit ran to the edge of the IC50 search range (0.0316 µM); the data do not place an IC50.',
    ],
    [
      'a clean curve',
      curve(2, 1.3),
      {},
      'fitted',
      'IC50 2 µM (95 % CI 2 µM to 2 µM), Hill slope 1.3, from 6 wells at 6 concentrations.',
    ],
  ])('%s → %s', (_case, input, options, status, message) => {
    const result = fitHill(input, options);
    expect(result.status).toBe(status);
    expect(result.message).toBe(message);
    if (status !== 'fitted') {
      // Never a number without a fit.
      expect(result).toMatchObject({ ic50_uM: null, ic50Ci95_uM: null, log10Ic50Se: null, hillSlope: null });
    }
    if (status === 'above_range') expect(result.ic50LowerBound_uM).toBe(30);
  });
});

describe('flags on a fitted curve', () => {
  test.each([
    [
      'steep slope',
      curve(2, 3.5),
      'hill_slope_outside_band',
      'Hill slope 3.5 is outside the plausible band 0.5–2.',
    ],
    [
      'shallow slope',
      curve(2, 0.35, [0.01, 0.1, 1, 10, 100, 1000]),
      'hill_slope_outside_band',
      'Hill slope 0.35 is outside the plausible band 0.5–2.',
    ],
    [
      'IC50 below the lowest concentration',
      curve(0.05),
      'ic50_below_range',
      'IC50 0.05 µM is below the lowest concentration tested (0.1 µM): an extrapolation.',
    ],
  ] as const)('%s', (_case, input, code, message) => {
    const result = fitHill(input);
    expect(result.status).toBe('fitted');
    expect(result.flags).toEqual([{ code, message }]);
  });

  test('hill4 with one well per free parameter has no confidence interval, and says so', () => {
    const result = fitHill(curve(2, 1, [0.3, 1, 3, 10]), { model: 'hill4' });
    expect(result.status).toBe('fitted');
    expect(result.log10Ic50Se).toBeNull();
    expect(result.ic50Ci95_uM).toBeNull();
    expect(result.flags.map((f) => f.code)).toEqual(['no_confidence_interval']);
  });

  test('a slope inside 0.5–2 and IC50 inside the range raise no flag; hill2 reports fixed bottom 0 and top 1', () => {
    const result = fitHill(curve(2, 1));
    expect(result.flags).toEqual([]);
    expect(result).toMatchObject({ bottom: 0, top: 1 });
  });
});

describe('wells', () => {
  test('excluded wells are left out, whatever they hold', () => {
    // An outlier at 3 µM (block 0.05 instead of 0.6) and a non-numeric well, both excluded.
    const base = curve(2, 1);
    const input: HillFitInput = {
      concentration_uM: [...Array.from(base.concentration_uM), 3, 10],
      block: [...Array.from(base.block), 0.05, NaN],
      excluded: [false, false, false, false, false, false, true, true],
    };
    const result = fitHill(input);
    expect(result.n).toBe(6);
    expect(result.ic50_uM).toBeCloseTo(2, 8);
  });

  test('replicates each count as a well; concentration 0 counts as a well, not a tested concentration', () => {
    const c = [0, 0, 0.1, 0.1, 0.3, 0.3, 1, 1, 3, 3, 10, 10];
    const result = fitHill({ concentration_uM: c, block: c.map((x) => hillBlock(x, 1, 1)) });
    expect(result).toMatchObject({ status: 'fitted', n: 12, concentrations: 5 });
    expect(result.ic50_uM).toBeCloseTo(1, 8);
  });

  test('inputs are not mutated and the same input gives the same result', () => {
    const concentration = Float64Array.from([0.1, 0.3, 1, 3, 10, 30]);
    const block = Float64Array.from([0.06, 0.12, 0.35, 0.62, 0.83, 0.95]);
    const first = fitHill({ concentration_uM: concentration, block });
    expect(Array.from(block)).toEqual([0.06, 0.12, 0.35, 0.62, 0.83, 0.95]);
    expect(Array.from(concentration)).toEqual([0.1, 0.3, 1, 3, 10, 30]);
    expect(fitHill({ concentration_uM: concentration, block })).toEqual(first);
  });

  test.each<[string, HillFitInput, string]>([
    [
      'length mismatch',
      { concentration_uM: [1, 2, 3], block: [0.1, 0.2] },
      'concentration_uM has 3 values but block has 2',
    ],
    [
      'negative concentration',
      { concentration_uM: [1, -2, 3], block: [0.1, 0.2, 0.3] },
      'well 1: concentration_uM must be a finite number ≥ 0, got -2',
    ],
    [
      'non-numeric block in a well in use',
      { concentration_uM: [1, 2, 3], block: [0.1, NaN, 0.3] },
      'well 1: block must be a finite number, got NaN',
    ],
  ])('rejects %s', (_case, input, message) => {
    expect(() => fitHill(input)).toThrow(message);
  });

  test.each<[HillFitOptions, string]>([
    [{ model: 'hill3' as 'hill2' }, "model must be 'hill2' or 'hill4', got hill3"],
    [{ minConcentrations: 2 }, 'minConcentrations must be an integer ≥ 3, got 2'],
    [{ hillSlopeBand: [2, 0.5] }, 'hillSlopeBand must be [low, high] with finite low < high, got [2, 0.5]'],
  ])('rejects bad options %j', (options, message) => {
    expect(() => fitHill(curve(1), options)).toThrow(message);
  });
});
