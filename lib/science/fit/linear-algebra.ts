// Small dense symmetric positive-definite algebra for least squares (p ≤ a handful of parameters).
// Matrices are row-major Float64Array of length p·p.

/** Relative pivot below which a matrix counts as not positive definite (numerically singular). */
const PIVOT_TOLERANCE = 64 * Number.EPSILON;

/**
 * Cholesky factorisation A = L·Lᵀ (the standard column-by-column algorithm).
 * Writes L into the lower triangle of `factor` (upper triangle zeroed).
 * @returns false when A is not (numerically) positive definite; `factor` is then unusable.
 */
export function choleskyFactor(a: Float64Array, p: number, factor: Float64Array): boolean {
  for (let j = 0; j < p; j++) {
    let diagonal = a[j * p + j]!;
    for (let k = 0; k < j; k++) diagonal -= factor[j * p + k]! ** 2;
    if (!(diagonal > PIVOT_TOLERANCE * Math.abs(a[j * p + j]!)) || !Number.isFinite(diagonal)) return false;
    const pivot = Math.sqrt(diagonal);
    factor[j * p + j] = pivot;
    for (let i = j + 1; i < p; i++) {
      let value = a[i * p + j]!;
      for (let k = 0; k < j; k++) value -= factor[i * p + k]! * factor[j * p + k]!;
      factor[i * p + j] = value / pivot;
      factor[j * p + i] = 0;
    }
  }
  return true;
}

/** Solves L·Lᵀ·x = b for x, given the factor from {@link choleskyFactor}; `b` is not modified. */
export function choleskySolve(factor: Float64Array, p: number, b: Float64Array, x: Float64Array): void {
  for (let i = 0; i < p; i++) {
    let value = b[i]!;
    for (let k = 0; k < i; k++) value -= factor[i * p + k]! * x[k]!;
    x[i] = value / factor[i * p + i]!;
  }
  for (let i = p - 1; i >= 0; i--) {
    let value = x[i]!;
    for (let k = i + 1; k < p; k++) value -= factor[k * p + i]! * x[k]!;
    x[i] = value / factor[i * p + i]!;
  }
}

/**
 * Inverse of a symmetric positive-definite matrix, or null when it is (numerically) singular.
 * Used for the covariance s²·(JᵀJ)⁻¹ of a least-squares fit.
 */
export function inverseSymmetricPositiveDefinite(a: Float64Array, p: number): Float64Array | null {
  const factor = new Float64Array(p * p);
  if (!choleskyFactor(a, p, factor)) return null;
  const inverse = new Float64Array(p * p);
  const unit = new Float64Array(p);
  const column = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    unit.fill(0);
    unit[j] = 1;
    choleskySolve(factor, p, unit, column);
    for (let i = 0; i < p; i++) inverse[i * p + j] = column[i]!;
  }
  return inverse;
}
