// Property tests: a Hill fit recovers the parameters of noise-free data generated from known values.
import fc from 'fast-check';
import { expect, test } from 'vitest';
import { fitHill } from '@/lib/science/fit/hill-fit';
import { hillBlock } from '@/lib/science/fit/hill-model';

// Half-log series over 3.5 decades, as on a typical 8-point plate layout (Gatewell's demo layout, invented).
const SERIES_uM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];

function plate(ic50_uM: number, slope: number, replicates: number, bottom = 0, top = 1) {
  const concentration_uM = SERIES_uM.flatMap((c) => Array<number>(replicates).fill(c));
  return { concentration_uM, block: concentration_uM.map((c) => hillBlock(c, ic50_uM, slope, bottom, top)) };
}

test('hill2 recovers IC50 and Hill slope of noise-free data (tolerance 1e-6 in log10 IC50 and slope)', () => {
  fc.assert(
    fc.property(
      fc.double({ min: -1.5, max: 1, noNaN: true }),
      fc.double({ min: 0.6, max: 1.8, noNaN: true }),
      fc.integer({ min: 1, max: 3 }),
      (log10Ic50, slope, replicates) => {
        const result = fitHill(plate(10 ** log10Ic50, slope, replicates));
        expect(result.status).toBe('fitted');
        expect(Math.abs(Math.log10(result.ic50_uM!) - log10Ic50)).toBeLessThan(1e-6);
        expect(Math.abs(result.hillSlope! - slope)).toBeLessThan(1e-6);
        expect(result.n).toBe(8 * replicates);
        expect(result.ic50Ci95_uM![0]).toBeLessThanOrEqual(result.ic50_uM!);
        expect(result.ic50Ci95_uM![1]).toBeGreaterThanOrEqual(result.ic50_uM!);
      },
    ),
    { numRuns: 200 },
  );
});

test('hill4 recovers IC50, slope, bottom and top of noise-free data (tolerance 1e-5)', () => {
  fc.assert(
    fc.property(
      fc.double({ min: -1, max: 0.5, noNaN: true }),
      fc.double({ min: 0.7, max: 1.5, noNaN: true }),
      fc.double({ min: -0.1, max: 0.1, noNaN: true }),
      fc.double({ min: 0.8, max: 1.1, noNaN: true }),
      (log10Ic50, slope, bottom, top) => {
        const result = fitHill(plate(10 ** log10Ic50, slope, 2, bottom, top), { model: 'hill4' });
        expect(result.status).toBe('fitted');
        expect(Math.abs(Math.log10(result.ic50_uM!) - log10Ic50)).toBeLessThan(1e-5);
        expect(Math.abs(result.hillSlope! - slope)).toBeLessThan(1e-5);
        expect(Math.abs(result.bottom! - bottom)).toBeLessThan(1e-5);
        expect(Math.abs(result.top! - top)).toBeLessThan(1e-5);
      },
    ),
    { numRuns: 200 },
  );
});

test('the fit does not depend on the order of the wells (rotated)', () => {
  fc.assert(
    fc.property(
      fc.double({ min: -1.5, max: 1, noNaN: true }),
      fc.integer({ min: 0, max: 1000 }),
      (log10Ic50, shift) => {
        const data = plate(10 ** log10Ic50, 1.1, 2);
        const order = data.block.map((_, i) => (i + shift) % data.block.length);
        const shuffled = {
          concentration_uM: order.map((i) => data.concentration_uM[i]!),
          block: order.map((i) => data.block[i]!),
        };
        expect(Math.log10(fitHill(shuffled).ic50_uM!)).toBeCloseTo(Math.log10(fitHill(data).ic50_uM!), 8);
      },
    ),
    { numRuns: 50 },
  );
});
