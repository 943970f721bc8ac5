// The model interface of Gatewell's least-squares optimiser and the per-iteration linear algebra.

/** A curve y = f(x; p) with its analytic gradient in the parameters. */
export interface CurveModel {
  /** Number of parameters p. */
  readonly parameterCount: number;
  /**
   * Value of the model at x. When `gradient` is given, writes ∂f/∂p_j into gradient[j] (length p).
   * Must not keep or modify `parameters`.
   */
  evaluate(x: number, parameters: Float64Array, gradient?: Float64Array): number;
}

/**
 * Residuals r_i = f(x_i; p) − y_i into `residuals`; returns Σr² (plain summation: one curve has tens
 * of points and this runs every iteration; the reported RSS is summed again with compensation).
 */
export function evaluateResiduals(
  model: CurveModel,
  x: Float64Array,
  y: Float64Array,
  parameters: Float64Array,
  residuals: Float64Array,
): number {
  let rss = 0;
  for (let i = 0; i < x.length; i++) {
    const r = model.evaluate(x[i]!, parameters) - y[i]!;
    residuals[i] = r;
    rss += r * r;
  }
  return rss;
}

/**
 * Residuals, Jacobian J (n×p, row-major), JᵀJ and the gradient g = Jᵀr at `parameters`; returns Σr².
 */
export function buildNormalEquations(
  model: CurveModel,
  x: Float64Array,
  y: Float64Array,
  parameters: Float64Array,
  residuals: Float64Array,
  jacobian: Float64Array,
  normal: Float64Array,
  gradient: Float64Array,
): number {
  const p = model.parameterCount;
  const row = new Float64Array(p);
  normal.fill(0);
  gradient.fill(0);
  let rss = 0;
  for (let i = 0; i < x.length; i++) {
    const r = model.evaluate(x[i]!, parameters, row) - y[i]!;
    residuals[i] = r;
    rss += r * r;
    for (let a = 0; a < p; a++) {
      const ja = row[a]!;
      jacobian[i * p + a] = ja;
      gradient[a] = gradient[a]! + ja * r;
      for (let b = 0; b <= a; b++) normal[a * p + b] = normal[a * p + b]! + ja * row[b]!;
    }
  }
  for (let a = 0; a < p; a++) for (let b = a + 1; b < p; b++) normal[a * p + b] = normal[b * p + a]!;
  return rss;
}
