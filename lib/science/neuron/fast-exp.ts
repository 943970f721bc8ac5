/**
 * e^(−z) for z ≥ 0, from a table of e^(−k/64) and a 4th-order Taylor term for the remainder
 * r < 1/64 (relative error below 1e-11). Math.exp dominated the integrator's step on a
 * 2-core machine; this is about four times cheaper.
 */
const STEPS_PER_UNIT = 64;
const Z_MAX = 50;
const TABLE = Float64Array.from({ length: Z_MAX * STEPS_PER_UNIT + 1 }, (_, k) => Math.exp(-k / STEPS_PER_UNIT));

export function expNeg(z: number): number {
  if (!(z < Z_MAX)) return z >= Z_MAX ? 0 : Math.exp(-z);
  if (z < 0) return Math.exp(-z);
  const s = z * STEPS_PER_UNIT;
  const k = s | 0;
  const r = (s - k) / STEPS_PER_UNIT;
  return TABLE[k]! * (1 - r * (1 - r * (0.5 - r * (1 / 6 - r / 24))));
}
