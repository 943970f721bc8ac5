import { unshiftedGateInfTau, type CompiledModel } from './model';

/**
 * Per-gate update coefficients on a voltage grid, for one time step dt: over a step with V held,
 * x ← A(V)·x + B(V) with A = exp(−dt/τ(V)), B = x∞(V)·(1 − A) (exact for frozen V).
 * Linear interpolation between grid points; grid spacing chosen so the interpolation error in
 * A and B stays below about 1e-6 relative (see tests/unit/neuron-integrator.test.ts). The table holds
 * the gates without their voltage shifts (state-dependent block); the step looks a shifted gate up at
 * V − shift, so one table serves every shift.
 */
export interface GateTable {
  vMin_mV: number;
  invStep_per_mV: number;
  /** Number of grid intervals; valid index range [0, intervals). */
  intervals: number;
  /** Interleaved: coefficients[(i·gates + j)·2] = A, +1 = B. */
  coefficients: Float64Array;
}

/** Grid: −150 … +100 mV every 0.02 mV (a spike of either preset stays well inside it). */
export const TABLE_V_MIN_mV = -150;
export const TABLE_V_MAX_mV = 100;
export const TABLE_STEP_mV = 0.02;

const cache = new Map<string, GateTable>();
const CACHE_LIMIT = 32;

/** Build (or reuse) the table of a model's kinetics for step dt. */
export function gateTable(model: CompiledModel, dt_ms: number): GateTable {
  const key = `${model.kineticsKey}|${dt_ms}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const intervals = Math.round((TABLE_V_MAX_mV - TABLE_V_MIN_mV) / TABLE_STEP_mV);
  const nGates = model.gates.length;
  const coefficients = new Float64Array((intervals + 1) * nGates * 2);
  const out = new Float64Array(2);
  for (let i = 0; i <= intervals; i++) {
    const v = TABLE_V_MIN_mV + i * TABLE_STEP_mV;
    for (let j = 0; j < nGates; j++) {
      unshiftedGateInfTau(model.gates[j]!, v, out);
      const a = Math.exp(-dt_ms / out[1]!);
      coefficients[(i * nGates + j) * 2] = a;
      coefficients[(i * nGates + j) * 2 + 1] = out[0]! * (1 - a);
    }
  }
  const table = { vMin_mV: TABLE_V_MIN_mV, invStep_per_mV: 1 / TABLE_STEP_mV, intervals, coefficients };
  if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
  cache.set(key, table);
  return table;
}
