import { describe, expect, test } from 'vitest';
import { splitCurve, testedRange, type CurvePoint } from '@/components/fits/curve-parts';

// Invented curve points; expected cuts are linear interpolation on log10 concentration worked by hand
// (log10 0.3 = −0.52288 and log10 3 = 0.47712, from log tables; no other outside source needed).
const p = (
  c: number,
  block: number,
  low: number | null = block - 0.1,
  high: number | null = block + 0.1,
) => ({
  concentration_uM: c,
  block,
  low,
  high,
});
const curve: CurvePoint[] = [p(0.01, 0.02), p(0.1, 0.1), p(1, 0.5), p(10, 0.9), p(100, 0.98)];
const cs = (points: CurvePoint[]) => points.map((q) => q.concentration_uM);

describe('the fitted curve cut at the tested range', () => {
  test('range ends on curve points: parts share those points', () => {
    const parts = splitCurve(curve, 0.1, 10);
    expect(cs(parts.below)).toEqual([0.01, 0.1]);
    expect(cs(parts.within)).toEqual([0.1, 1, 10]);
    expect(cs(parts.above)).toEqual([10, 100]);
  });

  test('range ends between curve points: a point is added at each end, read on the log axis', () => {
    const parts = splitCurve(curve, 0.3, 3);
    expect(cs(parts.within)).toEqual([0.3, 1, 3]);
    // 0.3 µM lies 0.47712 of the way from 0.1 to 1 on log10: block 0.1 + 0.4 × 0.47712.
    expect(parts.within[0]!.block).toBeCloseTo(0.290848, 5);
    expect(parts.within[0]!.low).toBeCloseTo(0.190848, 5);
    // 3 µM lies 0.47712 of the way from 1 to 10: block 0.5 + 0.4 × 0.47712.
    expect(parts.within.at(-1)!.block).toBeCloseTo(0.690848, 5);
    expect(parts.below.at(-1)).toEqual(parts.within[0]);
    expect(parts.above[0]).toEqual(parts.within.at(-1));
    expect(cs(parts.below)).toEqual([0.01, 0.1, 0.3]);
    expect(cs(parts.above)).toEqual([3, 10, 100]);
  });

  test('a curve inside the range is all solid; a band missing stays missing', () => {
    const bare = curve.map((q) => ({ ...q, low: null, high: null }));
    const parts = splitCurve(bare, 0.001, 1000);
    expect(cs(parts.within)).toEqual(cs(curve));
    expect(parts.below).toEqual([]);
    expect(parts.above).toEqual([]);
    expect(splitCurve(bare, 0.3, 3).within[0]!.low).toBeNull();
  });

  test('one tested concentration draws no solid part', () => {
    const parts = splitCurve(curve, 1, 1);
    expect(parts.within).toEqual([]);
    expect(cs(parts.below)).toEqual([0.01, 0.1, 1]);
    expect(cs(parts.above)).toEqual([1, 10, 100]);
  });

  test('the tested range counts excluded wells and ignores wells without a concentration', () => {
    expect(
      testedRange([
        { concentration_uM: 0.03 },
        { concentration_uM: null },
        { concentration_uM: 30 },
        { concentration_uM: 0 },
      ]),
    ).toEqual({ lo_uM: 0.03, hi_uM: 30 });
    expect(testedRange([{ concentration_uM: null }])).toBeNull();
  });
});
