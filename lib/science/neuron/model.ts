import { evaluateRate, evaluateTau } from './rate-forms';
import type { GateKinetics, MembraneState, NeuronPreset } from './types';

/** A preset flattened for the integrator: gates in one list, conductances pointing at them. */
export interface CompiledModel {
  presetName: string;
  capacitance_uF_cm2: number;
  /**
   * Per gate: its kinetics, the temperature factor φ applied to its rates, and a voltage shift: the
   * gate's rates are taken at V − shift_mV (0 unless state-dependent block shifts an inactivation gate).
   */
  gates: { label: string; kinetics: GateKinetics; phi: number; shift_mV: number }[];
  conductanceNames: string[];
  /** Scaled maximal conductances (mS/cm²), in conductance order. */
  g_mS_cm2: Float64Array;
  reversal_mV: Float64Array;
  /** Terms of conductance k: termGate/termPower[termStart[k] .. termStart[k+1]). */
  termStart: Int32Array;
  termGate: Int32Array;
  termPower: Int32Array;
  /** Identifies the kinetics (preset and temperature), for sharing rate tables. */
  kineticsKey: string;
  /** The preset's holding current (µA/cm²), added to every drive. */
  holdingCurrent_uA_cm2: number;
}

/**
 * Flatten a preset, with each conductance multiplied by `scale[name]` (default 1), e.g.
 * { gNa: 0.7 } for 30 % block, and the inactivation gate of each conductance in `inactivationShift`
 * shifted along the voltage axis by that many mV (state-dependent block: its rates, so h∞ and τh, are
 * taken at V − shift; a negative shift moves inactivation to more negative voltages). Throws on a
 * name the preset does not have, or a shift of a conductance without an inactivation gate.
 */
export function compileModel(
  preset: NeuronPreset,
  scale: Readonly<Record<string, number>> = {},
  inactivationShift: Readonly<Record<string, number>> = {},
): CompiledModel {
  const names = preset.conductances.map((c) => c.name);
  if (names.length === 0) throw new Error(`preset ${preset.name} has no conductances`);
  for (const key of [...Object.keys(scale), ...Object.keys(inactivationShift)]) {
    if (!names.includes(key))
      throw new Error(`preset ${preset.name} has no conductance "${key}" (has ${names.join(', ')})`);
  }
  for (const [key, shift] of Object.entries(inactivationShift)) {
    if (!Number.isFinite(shift)) throw new Error(`inactivation shift of ${key} must be a finite number`);
    const c = preset.conductances.find((x) => x.name === key);
    if (!c?.gates.some((g) => g.inactivationSlope_mV !== undefined))
      throw new Error(`conductance ${key} of preset ${preset.name} has no inactivation gate to shift`);
  }
  const gates: CompiledModel['gates'] = [];
  const termStart = new Int32Array(names.length + 1);
  const termGate: number[] = [];
  const termPower: number[] = [];
  preset.conductances.forEach((c, k) => {
    termStart[k] = termGate.length;
    const q10 = c.q10 ?? 1;
    const phi =
      (c.rateFactor ?? 1) *
      q10 ** ((preset.temperature_C - (c.referenceTemperature_C ?? preset.temperature_C)) / 10);
    for (const gate of c.gates) {
      if (!Number.isInteger(gate.power) || gate.power < 1)
        throw new Error(`gate ${c.name}.${gate.name}: power must be a positive integer`);
      termGate.push(gates.length);
      termPower.push(gate.power);
      const shift_mV = gate.inactivationSlope_mV !== undefined ? (inactivationShift[c.name] ?? 0) : 0;
      if (shift_mV !== 0 && gate.kinetics.kind === 'instantaneous')
        throw new Error(`gate ${c.name}.${gate.name}: an instantaneous gate cannot be shifted`);
      gates.push({ label: `${c.name}.${gate.name}`, kinetics: gate.kinetics, phi, shift_mV });
    }
  });
  termStart[names.length] = termGate.length;
  return {
    presetName: preset.name,
    capacitance_uF_cm2: preset.capacitance_uF_cm2,
    gates,
    conductanceNames: names,
    g_mS_cm2: Float64Array.from(preset.conductances, (c) => c.g_mS_cm2 * (scale[c.name] ?? 1)),
    reversal_mV: Float64Array.from(preset.conductances, (c) => c.reversal_mV),
    termStart,
    termGate: Int32Array.from(termGate),
    termPower: Int32Array.from(termPower),
    holdingCurrent_uA_cm2: preset.holdingCurrent_uA_cm2 ?? 0,
    kineticsKey: `${preset.name}@${preset.temperature_C}:${JSON.stringify(preset.conductances.map((c) => [c.q10, c.referenceTemperature_C, c.rateFactor, c.gates]))}`,
  };
}

/**
 * Steady state x∞ and time constant τ (ms) of a gate at V, written into out[0], out[1], with the
 * gate's voltage shift applied (rates at V − shift). An instantaneous gate has τ = 0: the exact
 * update exp(−dt/τ) = 0 sets it to x∞(V).
 */
export function gateInfTau(gate: CompiledModel['gates'][number], v_mV: number, out: Float64Array): void {
  unshiftedGateInfTau(gate, v_mV - gate.shift_mV, out);
}

/** As gateInfTau, without the gate's voltage shift (the rate tables are built unshifted). */
export function unshiftedGateInfTau(
  gate: CompiledModel['gates'][number],
  v_mV: number,
  out: Float64Array,
): void {
  const k = gate.kinetics;
  if (k.kind === 'instantaneous') {
    const a = evaluateRate(k.alpha, v_mV);
    out[0] = a / (a + evaluateRate(k.beta, v_mV));
    out[1] = 0;
  } else if (k.kind === 'alpha-beta') {
    const a = evaluateRate(k.alpha, v_mV);
    const b = evaluateRate(k.beta, v_mV);
    out[0] = a / (a + b);
    out[1] = 1 / (gate.phi * (a + b));
  } else {
    out[0] = evaluateRate(k.inf, v_mV);
    out[1] = evaluateTau(k.tau, v_mV) / gate.phi;
  }
}

/** The state with every gate at its steady state for V. */
export function steadyStateAt(model: CompiledModel, v_mV: number): MembraneState {
  const gates = new Float64Array(model.gates.length);
  const out = new Float64Array(2);
  model.gates.forEach((g, j) => {
    gateInfTau(g, v_mV, out);
    gates[j] = out[0] ?? 0;
  });
  return { v_mV, gates };
}

/** Total conductance G and Σ g·E (for V∞ = (I + ΣgE)/G) for the given gate values. */
export function conductanceSums(model: CompiledModel, gates: ArrayLike<number>): { g: number; gE: number } {
  let g = 0;
  let gE = 0;
  for (let k = 0; k < model.g_mS_cm2.length; k++) {
    let w = model.g_mS_cm2[k] ?? 0;
    for (let t = model.termStart[k] ?? 0; t < (model.termStart[k + 1] ?? 0); t++) {
      w *= (gates[model.termGate[t] ?? 0] ?? 0) ** (model.termPower[t] ?? 1);
    }
    g += w;
    gE += w * (model.reversal_mV[k] ?? 0);
  }
  return { g, gE };
}

/** Copy of a membrane state. */
export function cloneState(s: MembraneState): MembraneState {
  return { v_mV: s.v_mV, gates: Float64Array.from(s.gates) };
}
