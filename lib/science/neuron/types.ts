import type { RateForm, SigmoidForm, TauForm } from './rate-forms';

/** Gate kinetics as opening/closing rates: dx/dt = α(V)(1 − x) − β(V)x. */
export interface AlphaBetaKinetics {
  kind: 'alpha-beta';
  alpha: RateForm;
  beta: RateForm;
}

/** Gate kinetics as steady state and time constant: dx/dt = (x∞(V) − x)/τ(V). */
export interface InfTauKinetics {
  kind: 'inf-tau';
  inf: SigmoidForm;
  tau: TauForm;
}

/**
 * A gate taken at its steady state at every instant, x = α(V)/(α(V) + β(V)) (Wang & Buzsáki 1996's
 * sodium activation m∞). It has no time constant; the integrator sets it from V at each step.
 */
export interface InstantaneousKinetics {
  kind: 'instantaneous';
  alpha: RateForm;
  beta: RateForm;
}

export type GateKinetics = AlphaBetaKinetics | InfTauKinetics | InstantaneousKinetics;

/** One gating variable of a conductance, raised to `power` (m³ → power 3). */
export interface GateSpec {
  name: string;
  power: number;
  kinetics: GateKinetics;
  /**
   * Marks the conductance's inactivation gate, for state-dependent block
   * (lib/science/neuron/state-dependent-block.ts): the slope factor k (mV) of its steady state h∞(V),
   * taken as the slope of the Boltzmann curve with the same steepness at the midpoint,
   * k = −1/(4·h∞′(V½)). Derived per preset from its own rate functions; the preset file shows how.
   */
  inactivationSlope_mV?: number;
}

/** One membrane conductance: I = g · Π gates^power · (V − E). */
export interface ConductanceSpec {
  /** Name used in block maps and results, e.g. 'gNa'. */
  name: string;
  description: string;
  g_mS_cm2: number;
  reversal_mV: number;
  /** Whether a compound may block it in a forecast. */
  blockable: boolean;
  gates: GateSpec[];
  /** Temperature scaling of every rate (α, β multiplied, τ divided) by q10^((T − reference)/10). */
  q10?: number;
  referenceTemperature_C?: number;
  /** A fixed factor on every rate of its gates besides q10 (Wang & Buzsáki 1996's φ = 5). @default 1 */
  rateFactor?: number;
}

/** A published single-compartment model, as data. */
export interface NeuronPreset {
  name: string;
  title: string;
  reference: string;
  capacitance_uF_cm2: number;
  temperature_C: number;
  conductances: ConductanceSpec[];
  /**
   * A constant current always injected (µA/cm², positive depolarising) as part of the published cell,
   * e.g. the holding current of a patch-clamped neuron; every drive adds to it. @default 0
   */
  holdingCurrent_uA_cm2?: number;
}

/** Membrane state: voltage and every gate, in the compiled gate order. */
export interface MembraneState {
  v_mV: number;
  gates: Float64Array;
}
