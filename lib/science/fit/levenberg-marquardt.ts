// Bounded Levenberg–Marquardt least squares with an analytic Jacobian (Gatewell's own optimiser).
// Damping follows Marquardt 1963 (SIAM J Appl Math 11:431) with a diagonal scaled by JᵀJ, and the
// gain-ratio update of Nielsen 1999 as given by Madsen, Nielsen & Tingleff, "Methods for non-linear
// least squares problems", 2004, section 3.2 (citation details from memory). Bounds: the step is
// projected onto the box and parameters held at a bound by the gradient are frozen for that step.
import { sum } from 'simple-statistics';
import { choleskyFactor, choleskySolve, inverseSymmetricPositiveDefinite } from './linear-algebra';
import { resolveLeastSquaresOptions, type LeastSquaresOptions } from './least-squares-options';
import { buildNormalEquations, evaluateResiduals, type CurveModel } from './least-squares-model';

export type { CurveModel } from './least-squares-model';
export type { LeastSquaresOptions } from './least-squares-options';

/** Why the iteration stopped; the first three are convergence. */
export type LeastSquaresStop = 'gradient' | 'step' | 'rss' | 'max_iterations' | 'non_finite' | 'stalled';

export interface LeastSquaresResult {
  /** Estimates, in the model's parameter order. */
  parameters: number[];
  /** Residual sum of squares Σ(f(x) − y)² at the estimates (compensated sum). */
  rss: number;
  iterations: number;
  converged: boolean;
  stop: LeastSquaresStop;
  /** n − p. */
  degreesOfFreedom: number;
  /** s²·(JᵀJ)⁻¹ with s² = RSS/(n − p); null when n ≤ p or JᵀJ is singular. */
  covariance: number[][] | null;
  /** Square roots of the covariance diagonal; null with the covariance. */
  standardErrors: number[] | null;
}

/** Fits `model` to (x, y) by bounded Levenberg–Marquardt; deterministic, inputs never mutated. */
export function fitLeastSquares(
  model: CurveModel,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: LeastSquaresOptions,
): LeastSquaresResult {
  const o = resolveLeastSquaresOptions(model, x, y, options);
  const n = x.length;
  const p = model.parameterCount;
  const xs = Float64Array.from(x);
  const ys = Float64Array.from(y);
  const params = Float64Array.from(o.initial);
  const trial = new Float64Array(p);
  const residuals = new Float64Array(n);
  const trialResiduals = new Float64Array(n);
  const jacobian = new Float64Array(n * p);
  const normal = new Float64Array(p * p);
  const gradient = new Float64Array(p);
  const scale = new Float64Array(p);
  const system = new Float64Array(p * p);
  const factor = new Float64Array(p * p);
  const rhs = new Float64Array(p);
  const step = new Float64Array(p);
  const free = new Uint8Array(p);

  let rss = buildNormalEquations(model, xs, ys, params, residuals, jacobian, normal, gradient);
  if (!Number.isFinite(rss) || !normal.every(Number.isFinite)) return finish('non_finite', 0);
  updateScale(scale, normal, p);
  let damping = o.initialDamping;
  let growth = 2;

  for (let iteration = 1; iteration <= o.maxIterations; iteration++) {
    markFree(free, params, gradient, o.lower, o.upper);
    if (gradientConverged(gradient, normal, free, rss, o.gradientTolerance))
      return finish('gradient', iteration - 1);
    for (let i = 0; i < p; i++) {
      for (let j = 0; j < p; j++) {
        system[i * p + j] = free[i] && free[j] ? normal[i * p + j]! : i === j ? 1 : 0;
      }
      if (free[i]) system[i * p + i] = system[i * p + i]! + damping * scale[i]!;
      rhs[i] = free[i] ? -gradient[i]! : 0;
    }
    if (!choleskyFactor(system, p, factor)) {
      damping *= growth;
      growth *= 2;
      continue;
    }
    choleskySolve(factor, p, rhs, step);
    let stepNorm = 0;
    let paramNorm = 0;
    for (let j = 0; j < p; j++) {
      trial[j] = Math.min(o.upper[j]!, Math.max(o.lower[j]!, params[j]! + step[j]!));
      step[j] = trial[j]! - params[j]!;
      stepNorm += step[j]! ** 2;
      paramNorm += params[j]! ** 2;
    }
    if (Math.sqrt(stepNorm) <= o.stepTolerance * (Math.sqrt(paramNorm) + o.stepTolerance))
      return finish('step', iteration);
    const trialRss = evaluateResiduals(model, xs, ys, trial, trialResiduals);
    const predicted = predictedReduction(step, gradient, normal, p);
    const actual = 0.5 * (rss - trialRss);
    if (Number.isFinite(trialRss) && actual > 0 && predicted > 0) {
      const previous = rss;
      params.set(trial);
      rss = buildNormalEquations(model, xs, ys, params, residuals, jacobian, normal, gradient);
      if (!Number.isFinite(rss) || !normal.every(Number.isFinite)) return finish('non_finite', iteration);
      updateScale(scale, normal, p);
      const ratio = actual / predicted;
      damping *= Math.max(1 / 3, 1 - (2 * ratio - 1) ** 3);
      growth = 2;
      if (actual <= 0.5 * o.rssTolerance * previous && predicted <= 0.5 * o.rssTolerance * previous) {
        return finish('rss', iteration);
      }
    } else {
      damping *= growth;
      growth *= 2;
      if (damping > 1e32) return finish('stalled', iteration);
    }
  }
  return finish('max_iterations', o.maxIterations);

  function finish(stop: LeastSquaresStop, iterations: number): LeastSquaresResult {
    const degreesOfFreedom = n - p;
    const converged = stop === 'gradient' || stop === 'step' || stop === 'rss';
    const inverse = converged && degreesOfFreedom > 0 ? inverseSymmetricPositiveDefinite(normal, p) : null;
    evaluateResiduals(model, xs, ys, params, residuals);
    const finalRss = sum(Array.from(residuals, (r) => r * r));
    const s2 = finalRss / degreesOfFreedom;
    const covariance = inverse
      ? Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => s2 * inverse[i * p + j]!))
      : null;
    return {
      parameters: Array.from(params),
      rss: finalRss,
      iterations,
      converged,
      stop,
      degreesOfFreedom,
      covariance,
      standardErrors: covariance ? covariance.map((row, i) => Math.sqrt(row[i]!)) : null,
    };
  }
}

/** Marquardt's scaling: the running maximum of diag(JᵀJ), so the damping is invariant to parameter units. */
function updateScale(scale: Float64Array, normal: Float64Array, p: number): void {
  for (let j = 0; j < p; j++) scale[j] = Math.max(scale[j]!, normal[j * p + j]!, Number.MIN_VALUE);
}

/** A parameter is frozen when it sits on a bound and the descent direction −g points out of the box. */
function markFree(
  free: Uint8Array,
  params: Float64Array,
  gradient: Float64Array,
  lower: Float64Array,
  upper: Float64Array,
): void {
  for (let j = 0; j < free.length; j++) {
    const atLower = params[j]! <= lower[j]! && gradient[j]! > 0;
    const atUpper = params[j]! >= upper[j]! && gradient[j]! < 0;
    free[j] = atLower || atUpper ? 0 : 1;
  }
}

/** Scale-free test: the cosine between the residual vector and every free Jacobian column (as in MINPACK's gtol). */
function gradientConverged(
  gradient: Float64Array,
  normal: Float64Array,
  free: Uint8Array,
  rss: number,
  tolerance: number,
): boolean {
  if (rss === 0) return true;
  const p = gradient.length;
  const residualNorm = Math.sqrt(rss);
  for (let j = 0; j < p; j++) {
    const columnNorm = Math.sqrt(normal[j * p + j]!);
    if (free[j] && columnNorm > 0 && Math.abs(gradient[j]!) / (columnNorm * residualNorm) > tolerance)
      return false;
  }
  return true;
}

/** Reduction of ½‖r‖² predicted by the linear model for `step`: −stepᵀg − ½ stepᵀ(JᵀJ)step. */
function predictedReduction(
  step: Float64Array,
  gradient: Float64Array,
  normal: Float64Array,
  p: number,
): number {
  let linear = 0;
  let quadratic = 0;
  for (let i = 0; i < p; i++) {
    linear += step[i]! * gradient[i]!;
    for (let j = 0; j < p; j++) quadratic += step[i]! * normal[i * p + j]! * step[j]!;
  }
  return -linear - 0.5 * quadratic;
}
