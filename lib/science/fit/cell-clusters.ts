// Confidence intervals with the cell as the unit, for points that come several to a cell (cumulative
// application: one cell receives the whole concentration series in turn).
import type { CurveModel } from './least-squares-model';
import { inverseSymmetricPositiveDefinite } from './linear-algebra';

/**
 * The applications of one cell share that cell's run-down, current and potency, so their points are not
 * independent and s²(JᵀJ)⁻¹ understates the spread of the estimates. Here the cell is the unit: the
 * cluster-robust ("sandwich") covariance of the least-squares estimates,
 *
 *   V = c · (JᵀJ)⁻¹ (Σ_g J_gᵀ r_g r_gᵀ J_g) (JᵀJ)⁻¹,  c = G/(G − 1) · (n − 1)/(n − p),
 *
 * with J the Jacobian and r the residuals at the estimates, J_g and r_g the rows of cell g, G cells,
 * n points and p free parameters, and intervals from Student's t on G − 1 degrees of freedom.
 * The sandwich is that of Liang & Zeger 1986 (Biometrika 73:13–22) for clustered data; the factor c
 * ("CR1") and the G − 1 degrees of freedom are those recommended for few clusters by Cameron & Miller
 * 2015, "A practitioner's guide to cluster-robust inference" (J Human Resources 50:317–372), sections
 * IV and VI (citation details from memory). When every cell holds the same concentration series, as on a
 * cumulative plate, the linear form of this interval is the t-interval of the mean of the cells' own
 * estimates, exact for normal data; for the Hill curve it is close to that (tests/unit/fit-cell-clusters.test.ts
 * shows its coverage on simulated plates).
 */
export interface CellClusterCovariance {
  /** V above, p × p, in the model's parameter order. */
  covariance: number[][];
  /** Cells with at least one point: G. */
  cells: number;
  /** G − 1: the degrees of freedom of the t quantile for intervals. */
  degreesOfFreedom: number;
}

/**
 * Whether cell-level intervals apply: cells are given and at least one cell holds two or more points.
 * (Where every cell holds one point the points are independent and the model's own interval stands.)
 */
export function pointsShareCells(cells: ArrayLike<string> | undefined): boolean {
  if (!cells) return false;
  const seen = new Set<string>();
  for (let i = 0; i < cells.length; i++) {
    if (seen.has(cells[i]!)) return true;
    seen.add(cells[i]!);
  }
  return false;
}

/**
 * V above at the estimates `parameters` of `model` on (x, y) with point i in cell `cells[i]`; null with
 * fewer than two cells, n ≤ p, or JᵀJ singular.
 */
export function cellClusterCovariance(
  model: CurveModel,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  parameters: readonly number[],
  cells: ArrayLike<string>,
): CellClusterCovariance | null {
  const n = x.length;
  const p = model.parameterCount;
  if (cells.length !== n) throw new RangeError(`cells has ${cells.length} values but there are ${n} points`);
  const theta = Float64Array.from(parameters);
  const row = new Float64Array(p);
  const normal = new Float64Array(p * p);
  // Per cell: s_g = J_gᵀ r_g (the cell's score).
  const scores = new Map<string, Float64Array>();
  for (let i = 0; i < n; i++) {
    const r = model.evaluate(x[i]!, theta, row) - y[i]!;
    for (let a = 0; a < p; a++)
      for (let b = 0; b < p; b++) normal[a * p + b] = normal[a * p + b]! + row[a]! * row[b]!;
    let score = scores.get(cells[i]!);
    if (!score) scores.set(cells[i]!, (score = new Float64Array(p)));
    for (let a = 0; a < p; a++) score[a] = score[a]! + row[a]! * r;
  }
  const g = scores.size;
  if (g < 2 || n <= p) return null;
  const bread = inverseSymmetricPositiveDefinite(normal, p);
  if (!bread) return null;
  const meat = new Float64Array(p * p);
  for (const score of scores.values())
    for (let a = 0; a < p; a++)
      for (let b = 0; b < p; b++) meat[a * p + b] = meat[a * p + b]! + score[a]! * score[b]!;
  const c = (g / (g - 1)) * ((n - 1) / (n - p));
  const covariance = Array.from({ length: p }, (_, i) =>
    Array.from({ length: p }, (_, j) => {
      let v = 0;
      for (let a = 0; a < p; a++)
        for (let b = 0; b < p; b++) v += bread[i * p + a]! * meat[a * p + b]! * bread[b * p + j]!;
      return c * v;
    }),
  );
  if (!covariance.every((line) => line.every(Number.isFinite))) return null;
  return { covariance, cells: g, degreesOfFreedom: g - 1 };
}
