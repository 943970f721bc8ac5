// The fitted curve cut where the tested concentrations end: solid inside the range, dashed outside.
// Pure, so unit tests import it.

export interface CurvePoint {
  concentration_uM: number;
  block: number;
  low: number | null;
  high: number | null;
}

export interface CurveParts {
  /** Below the lowest tested concentration (drawn dashed); ends at the range's start. */
  below: CurvePoint[];
  /** From the lowest to the highest tested concentration (drawn solid). */
  within: CurvePoint[];
  /** Above the highest tested concentration (drawn dashed); starts at the range's end. */
  above: CurvePoint[];
}

const lerp = (a: number | null, b: number | null, t: number) =>
  a === null || b === null ? null : a + (b - a) * t;

/**
 * The curve's point at a concentration between two of its points, read on the log10 concentration axis
 * the plot draws (a straight line between the two points there).
 */
function pointAt(a: CurvePoint, b: CurvePoint, concentration_uM: number): CurvePoint {
  const span = Math.log10(b.concentration_uM) - Math.log10(a.concentration_uM);
  const t = span === 0 ? 0 : (Math.log10(concentration_uM) - Math.log10(a.concentration_uM)) / span;
  return {
    concentration_uM,
    block: a.block + (b.block - a.block) * t,
    low: lerp(a.low, b.low, t),
    high: lerp(a.high, b.high, t),
  };
}

/**
 * Cuts a curve (points in rising concentration) at the tested range [lo, hi] µM. The parts share their
 * boundary points, so the drawn line has no gap; a part the curve does not reach is empty.
 */
export function splitCurve(curve: readonly CurvePoint[], lo_uM: number, hi_uM: number): CurveParts {
  // The curve with a point added exactly at each end of the range that falls between two of its points.
  const dense: CurvePoint[] = [];
  curve.forEach((p, i) => {
    const prev = curve[i - 1];
    if (prev)
      for (const cut of [lo_uM, hi_uM])
        if (
          prev.concentration_uM < cut &&
          cut < p.concentration_uM &&
          !dense.some((d) => d.concentration_uM === cut)
        )
          dense.push(pointAt(prev, p, cut));
    dense.push(p);
  });
  const part = (keep: (c: number) => boolean) => {
    const points = dense.filter((p) => keep(p.concentration_uM));
    // A lone point draws nothing.
    return points.length < 2 ? [] : points;
  };
  return {
    below: part((c) => c <= lo_uM),
    within: part((c) => c >= lo_uM && c <= hi_uM),
    above: part((c) => c >= hi_uM),
  };
}

/**
 * The tested range of a fit's wells: the lowest and highest positive concentration among them, excluded
 * and QC-failed wells too (they were tested; the server's curve runs a decade beyond the same range).
 * Null when no well has one.
 */
export function testedRange(
  wells: readonly { concentration_uM: number | null }[],
): { lo_uM: number; hi_uM: number } | null {
  const tested = wells.map((w) => w.concentration_uM).filter((c): c is number => c !== null && c > 0);
  if (!tested.length) return null;
  return { lo_uM: Math.min(...tested), hi_uM: Math.max(...tested) };
}
