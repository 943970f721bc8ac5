import { downsampleMinMax, type VoltageTrace } from './downsample';
import { DEFAULT_DT_MS, simulate, type IntegratorOptions } from './integrate';
import type { CompiledModel } from './model';
import { findRest } from './rest';

export interface TraceRequest extends IntegratorOptions {
  drive_uA_cm2: number;
  /** Step length (ms). @default 1000 */
  duration_ms?: number;
  /** Unstimulated time shown before and after the step (ms). @default 20 */
  margin_ms?: number;
  /** Approximate number of points returned. @default 2000 */
  points?: number;
}

/** Voltage during a current step from rest, downsampled; t = 0 at step onset. */
export function voltageTrace(model: CompiledModel, request: TraceRequest): VoltageTrace {
  const dt = request.dt_ms ?? DEFAULT_DT_MS;
  const options = { dt_ms: dt, rates: request.rates };
  const margin = request.margin_ms ?? 20;
  const rest = findRest(model, options);
  const before = simulate(
    model,
    rest.start,
    { current_uA_cm2: 0, duration_ms: margin, record: true },
    options,
  );
  const step = simulate(
    model,
    before.end,
    { current_uA_cm2: request.drive_uA_cm2, duration_ms: request.duration_ms ?? 1000, record: true },
    options,
  );
  const after = simulate(model, step.end, { current_uA_cm2: 0, duration_ms: margin, record: true }, options);
  const a = before.trace!;
  const b = step.trace!;
  const c = after.trace!;
  // Each run's first sample repeats the previous run's last one.
  const all = new Float64Array(a.length + b.length - 1 + c.length - 1);
  all.set(a, 0);
  all.set(b.subarray(1), a.length);
  all.set(c.subarray(1), a.length + b.length - 1);
  return downsampleMinMax(all, -(a.length - 1) * dt, dt, request.points ?? 2000);
}
