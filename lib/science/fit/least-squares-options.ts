// Options of Gatewell's least-squares optimiser, checked and defaulted in one place.
import type { CurveModel } from './least-squares-model';

export interface LeastSquaresOptions {
  /** Start values, one per parameter; must lie within the bounds. */
  initial: ArrayLike<number>;
  /** Lower bounds. @default −Infinity for every parameter */
  lower?: ArrayLike<number>;
  /** Upper bounds. @default +Infinity for every parameter */
  upper?: ArrayLike<number>;
  /** Iterations (accepted or rejected steps) before giving up. @default 500 */
  maxIterations?: number;
  /** Stop when both actual and predicted relative reductions of the RSS fall below this. @default 1e-14 */
  rssTolerance?: number;
  /** Stop when ‖step‖ ≤ tol·(‖p‖ + tol). @default 1e-11 */
  stepTolerance?: number;
  /** Stop when the cosine between r and every free Jacobian column is below this. @default 1e-11 */
  gradientTolerance?: number;
  /** Initial damping λ, relative to diag(JᵀJ). @default 1e-3 (Madsen, Nielsen & Tingleff 2004, section 3.2; from memory) */
  initialDamping?: number;
}

export interface ResolvedLeastSquaresOptions {
  initial: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  maxIterations: number;
  rssTolerance: number;
  stepTolerance: number;
  gradientTolerance: number;
  initialDamping: number;
}

/** Checks the data and options and fills defaults; throws RangeError naming the fault. */
export function resolveLeastSquaresOptions(
  model: CurveModel,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: LeastSquaresOptions,
): ResolvedLeastSquaresOptions {
  const p = model.parameterCount;
  if (!Number.isInteger(p) || p < 1)
    throw new RangeError(`model.parameterCount must be a positive integer, got ${p}`);
  if (x.length !== y.length) throw new RangeError(`x has ${x.length} values but y has ${y.length}`);
  if (x.length < 1) throw new RangeError('no data points');
  for (let i = 0; i < x.length; i++) {
    if (Number.isNaN(x[i]) || !Number.isFinite(y[i]))
      throw new RangeError(`point ${i}: x and y must be numbers (y finite)`);
  }
  const initial = vector('initial', options.initial, p, NaN);
  const lower = vector('lower', options.lower, p, -Infinity);
  const upper = vector('upper', options.upper, p, Infinity);
  for (let j = 0; j < p; j++) {
    if (!Number.isFinite(initial[j]!)) throw new RangeError(`initial[${j}] must be a finite number`);
    if (!(lower[j]! <= initial[j]! && initial[j]! <= upper[j]!)) {
      throw new RangeError(`initial[${j}] = ${initial[j]} lies outside [${lower[j]}, ${upper[j]}]`);
    }
  }
  return {
    initial,
    lower,
    upper,
    maxIterations: positive('maxIterations', options.maxIterations, 500, true),
    rssTolerance: positive('rssTolerance', options.rssTolerance, 1e-14),
    stepTolerance: positive('stepTolerance', options.stepTolerance, 1e-11),
    gradientTolerance: positive('gradientTolerance', options.gradientTolerance, 1e-11),
    initialDamping: positive('initialDamping', options.initialDamping, 1e-3),
  };
}

function vector(name: string, value: ArrayLike<number> | undefined, p: number, fill: number): Float64Array {
  if (value === undefined) {
    if (Number.isNaN(fill)) throw new RangeError(`${name} is required`);
    return new Float64Array(p).fill(fill);
  }
  if (value.length !== p) throw new RangeError(`${name} must have ${p} values, got ${value.length}`);
  const out = Float64Array.from(value);
  if (out.some(Number.isNaN)) throw new RangeError(`${name} contains a value that is not a number`);
  return out;
}

function positive(name: string, value: number | undefined, fallback: number, integer = false): number {
  if (value === undefined) return fallback;
  if (!(value > 0) || !Number.isFinite(value) || (integer && !Number.isInteger(value))) {
    throw new RangeError(`${name} must be a positive ${integer ? 'integer' : 'number'}, got ${value}`);
  }
  return value;
}
