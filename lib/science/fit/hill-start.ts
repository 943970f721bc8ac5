// Deterministic start values and search box for a Hill fit, read from the data.
import type { ResolvedHillFitOptions, Interval } from './hill-options';

/** Mean block per distinct positive concentration, in increasing order of concentration. */
export interface ConcentrationLevel {
  concentration_uM: number;
  meanBlock: number;
  wells: number;
}

/** Groups replicate wells by concentration (exact equality), concentration 0 left out; plain means. */
export function concentrationLevels(
  concentration_uM: ArrayLike<number>,
  block: ArrayLike<number>,
): ConcentrationLevel[] {
  const sums = new Map<number, { total: number; wells: number }>();
  for (let i = 0; i < concentration_uM.length; i++) {
    const c = concentration_uM[i]!;
    if (!(c > 0)) continue;
    const entry = sums.get(c) ?? { total: 0, wells: 0 };
    entry.total += block[i]!;
    entry.wells += 1;
    sums.set(c, entry);
  }
  return [...sums.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([c, { total, wells }]) => ({ concentration_uM: c, meanBlock: total / wells, wells }));
}

/** Search box of the free parameters, [log10 IC50, slope, bottom, top] (hill2: the first two). */
export function hillSearchBox(
  levels: readonly ConcentrationLevel[],
  o: ResolvedHillFitOptions,
): { lower: Float64Array; upper: Float64Array } {
  const lowest = Math.log10(levels[0]!.concentration_uM);
  const highest = Math.log10(levels[levels.length - 1]!.concentration_uM);
  const boxes: Interval[] = [[lowest - o.searchDecades, highest + o.searchDecades], o.hillSlopeBounds];
  if (o.model === 'hill4') boxes.push(o.bottomBounds, o.topBounds);
  return { lower: Float64Array.from(boxes, (b) => b[0]), upper: Float64Array.from(boxes, (b) => b[1]) };
}

/**
 * Start values: bottom and top from the lowest and highest mean (hill4), Hill slope 1 (or −1, or the
 * middle of its bounds, whichever the bounds allow), log10 IC50 where the means cross halfway between
 * bottom and top (linear in log C), else at the level nearest halfway. All clamped into the box.
 */
export function hillStartValues(
  levels: readonly ConcentrationLevel[],
  o: ResolvedHillFitOptions,
  box: { lower: Float64Array; upper: Float64Array },
): Float64Array {
  const means = levels.map((l) => l.meanBlock);
  const bottom = o.model === 'hill4' ? Math.min(...means) : 0;
  const top = o.model === 'hill4' ? Math.max(...means) : 1;
  const [slopeLow, slopeHigh] = o.hillSlopeBounds;
  const slope =
    slopeLow <= 1 && 1 <= slopeHigh ? 1 : slopeLow <= -1 && -1 <= slopeHigh ? -1 : (slopeLow + slopeHigh) / 2;
  const start =
    o.model === 'hill4'
      ? [halfwayLog10(levels, (bottom + top) / 2), slope, bottom, top]
      : [halfwayLog10(levels, 0.5), slope];
  return Float64Array.from(start, (value, j) => Math.min(box.upper[j]!, Math.max(box.lower[j]!, value)));
}

function halfwayLog10(levels: readonly ConcentrationLevel[], half: number): number {
  for (let i = 1; i < levels.length; i++) {
    const a = levels[i - 1]!;
    const b = levels[i]!;
    if ((a.meanBlock - half) * (b.meanBlock - half) <= 0 && a.meanBlock !== b.meanBlock) {
      const t = (half - a.meanBlock) / (b.meanBlock - a.meanBlock);
      return (
        Math.log10(a.concentration_uM) + t * (Math.log10(b.concentration_uM) - Math.log10(a.concentration_uM))
      );
    }
  }
  let nearest = levels[0]!;
  for (const level of levels)
    if (Math.abs(level.meanBlock - half) < Math.abs(nearest.meanBlock - half)) nearest = level;
  return Math.log10(nearest.concentration_uM);
}
