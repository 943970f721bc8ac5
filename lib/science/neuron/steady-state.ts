import { conductanceSums, gateInfTau, steadyStateAt, type CompiledModel } from './model';

/**
 * Net steady-state membrane current (µA/cm², outward positive) at V with every gate at x∞(V), less the
 * preset's holding current: the drive needed to hold V there.
 */
export function steadyStateCurrent(model: CompiledModel, v_mV: number): number {
  // The same sums as conductanceSums over steadyStateAt, into buffers kept per model (the fixed-point
  // scans call this some hundreds of times per search).
  let buffers = scratch.get(model);
  if (!buffers) {
    buffers = { gates: new Float64Array(model.gates.length), out: new Float64Array(2) };
    scratch.set(model, buffers);
  }
  const { gates, out } = buffers;
  for (let j = 0; j < gates.length; j++) {
    gateInfTau(model.gates[j]!, v_mV, out);
    gates[j] = out[0] ?? 0;
  }
  let g = 0;
  let gE = 0;
  for (let k = 0; k < model.g_mS_cm2.length; k++) {
    let w = model.g_mS_cm2[k]!;
    for (let t = model.termStart[k]!; t < model.termStart[k + 1]!; t++)
      w *= gates[model.termGate[t]!]! ** model.termPower[t]!;
    g += w;
    gE += w * model.reversal_mV[k]!;
  }
  return g * v_mV - gE - model.holdingCurrent_uA_cm2;
}

const scratch = new WeakMap<CompiledModel, { gates: Float64Array; out: Float64Array }>();

export interface FixedPoint {
  v_mV: number;
  /** Linearly stable (every eigenvalue of the Jacobian has a negative real part). */
  stable: boolean;
}

const SCAN_FROM_mV = -150;
const SCAN_TO_mV = 60;
const SCAN_STEP_mV = 0.25;

/**
 * Every fixed point of the model under a constant current I, lowest voltage first: roots of
 * I_ss(V) = I found by a scan over −150…+60 mV and bisection to 1e-10 mV, each with its stability.
 */
export function fixedPoints(model: CompiledModel, current_uA_cm2 = 0): FixedPoint[] {
  const f = (v: number) => steadyStateCurrent(model, v) - current_uA_cm2;
  const roots: number[] = [];
  let vPrev = SCAN_FROM_mV;
  let fPrev = f(vPrev);
  for (let v = SCAN_FROM_mV + SCAN_STEP_mV; v <= SCAN_TO_mV + 1e-9; v += SCAN_STEP_mV) {
    const fv = f(v);
    if (fPrev === 0) roots.push(vPrev);
    else if (fPrev * fv < 0) roots.push(bisectRoot(f, vPrev, v, fPrev));
    vPrev = v;
    fPrev = fv;
  }
  return roots.map((v) => ({ v_mV: v, stable: isStable(model, v) }));
}

/**
 * The lowest stable fixed point under current I, or null: the same scan and bisection as fixedPoints,
 * stopped at the first stable root (so the same point as `fixedPoints(model, I).find((p) => p.stable)`,
 * for a fraction of the scan when the rest lies low).
 */
export function lowestStableFixedPoint(model: CompiledModel, current_uA_cm2 = 0): FixedPoint | null {
  const f = (v: number) => steadyStateCurrent(model, v) - current_uA_cm2;
  let vPrev = SCAN_FROM_mV;
  let fPrev = f(vPrev);
  for (let v = SCAN_FROM_mV + SCAN_STEP_mV; v <= SCAN_TO_mV + 1e-9; v += SCAN_STEP_mV) {
    const fv = f(v);
    let root: number | null = null;
    if (fPrev === 0) root = vPrev;
    else if (fPrev * fv < 0) root = bisectRoot(f, vPrev, v, fPrev);
    if (root !== null && isStable(model, root)) return { v_mV: root, stable: true };
    vPrev = v;
    fPrev = fv;
  }
  return null;
}

function bisectRoot(f: (v: number) => number, lo: number, hi: number, fLo: number): number {
  let a = lo;
  let b = hi;
  let fa = fLo;
  while (b - a > 1e-10) {
    const m = 0.5 * (a + b);
    const fm = f(m);
    if (fm === 0) return m;
    if (fa * fm < 0) b = m;
    else {
      a = m;
      fa = fm;
    }
  }
  return 0.5 * (a + b);
}

/**
 * Linear stability of the fixed point at V. The Jacobian has arrow form (V couples to every gate,
 * each gate only to V and itself), so det(λI − J) = (λ − a)·Π(λ + 1/τ_j) − Σ_j b_j c_j·Π_{i≠j}(λ + 1/τ_i)
 * with a = −G/C, b_j = ∂(dV/dt)/∂x_j, c_j = x∞_j′(V)/τ_j. Stability by the Routh–Hurwitz criterion.
 */
export function isStable(model: CompiledModel, v_mV: number): boolean {
  const state = steadyStateAt(model, v_mV);
  const x = state.gates;
  const nGates = model.gates.length;
  const c = model.capacitance_uF_cm2;
  const { g } = conductanceSums(model, x);
  let a = -g / c;
  const b = new Float64Array(nGates);
  for (let k = 0; k < model.g_mS_cm2.length; k++) {
    const drive = v_mV - model.reversal_mV[k]!;
    for (let t = model.termStart[k]!; t < model.termStart[k + 1]!; t++) {
      let d = model.g_mS_cm2[k]! * model.termPower[t]! * x[model.termGate[t]!]! ** (model.termPower[t]! - 1);
      for (let u = model.termStart[k]!; u < model.termStart[k + 1]!; u++) {
        if (u !== t) d *= x[model.termGate[u]!]! ** model.termPower[u]!;
      }
      b[model.termGate[t]!]! -= (d * drive) / c;
    }
  }
  const out = new Float64Array(2);
  const rate = new Float64Array(nGates);
  const cj = new Float64Array(nGates);
  const h = 1e-4;
  // Instantaneous gates (τ = 0) are functions of V: they fold into a as b_j · x∞_j′(V), not into the product.
  const slow: number[] = [];
  model.gates.forEach((gate, j) => {
    gateInfTau(gate, v_mV + h, out);
    const up = out[0]!;
    gateInfTau(gate, v_mV - h, out);
    const down = out[0]!;
    gateInfTau(gate, v_mV, out);
    if (out[1]! === 0) {
      a += b[j]! * ((up - down) / (2 * h));
      return;
    }
    slow.push(j);
    rate[j] = 1 / out[1]!;
    cj[j] = ((up - down) / (2 * h)) * rate[j]!;
  });
  // Coefficients in ascending powers of λ.
  let poly = [-a, 1];
  for (const j of slow) poly = multiplyLinear(poly, rate[j]!);
  for (const j of slow) {
    let term = [1];
    for (const i of slow) if (i !== j) term = multiplyLinear(term, rate[i]!);
    const bc = b[j]! * cj[j]!;
    term.forEach((coef, p) => (poly[p] = (poly[p] ?? 0) - bc * coef));
  }
  return routhHurwitzStable(poly);
}

/** (Σ p_i λ^i)·(λ + r). */
function multiplyLinear(p: number[], r: number): number[] {
  const out = new Array<number>(p.length + 1).fill(0);
  p.forEach((coef, i) => {
    out[i] = (out[i] ?? 0) + coef * r;
    out[i + 1] = (out[i + 1] ?? 0) + coef;
  });
  return out;
}

/** Every root in the open left half-plane? Coefficients ascending; Routh array first column. */
export function routhHurwitzStable(ascending: number[]): boolean {
  const desc = [...ascending].reverse();
  const lead = desc[0]!;
  const coef = desc.map((v) => v / lead);
  if (coef.some((v) => !(v > 0))) return false;
  let rowA = coef.filter((_, i) => i % 2 === 0);
  let rowB = coef.filter((_, i) => i % 2 === 1);
  for (let r = 0; r < coef.length - 1; r++) {
    const pivot = rowB[0] ?? 0;
    if (!(pivot > 0)) return false;
    const next = rowA.slice(1).map((v, i) => v - ((rowA[0] ?? 0) * (rowB[i + 1] ?? 0)) / pivot);
    rowA = rowB;
    rowB = next;
    if (rowB.length === 0) break;
  }
  return true;
}

/**
 * The first fixed point at or above `from_mV` − 5 mV under current I (scan of 0.25 mV steps up to
 * +40 mV above `from_mV`), if it is stable; otherwise null. Cheap enough to call per step current.
 */
export function stableFixedPointAbove(
  model: CompiledModel,
  current_uA_cm2: number,
  from_mV: number,
): FixedPoint | null {
  const f = (v: number) => steadyStateCurrent(model, v) - current_uA_cm2;
  let vPrev = from_mV - 5;
  let fPrev = f(vPrev);
  for (let v = vPrev + SCAN_STEP_mV; v <= from_mV + 40; v += SCAN_STEP_mV) {
    const fv = f(v);
    if (fPrev * fv <= 0) {
      const root = fPrev === 0 ? vPrev : bisectRoot(f, vPrev, v, fPrev);
      return isStable(model, root) ? { v_mV: root, stable: true } : null;
    }
    vPrev = v;
    fPrev = fv;
  }
  return null;
}
