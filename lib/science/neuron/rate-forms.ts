/**
 * Voltage-dependent rate and time-constant forms used by Gatewell's neuron presets.
 * A preset lists gates as data; these forms turn that data into numbers (V in mV, rates in 1/ms).
 */

/** r = rate · exp((V − mid)/scale). */
export interface ExponentialForm {
  form: 'exponential';
  rate_per_ms: number;
  mid_mV: number;
  scale_mV: number;
}

/** r = rate / (1 + exp(−(V − mid)/scale)). With rate 1 it is a steady-state activation curve. */
export interface SigmoidForm {
  form: 'sigmoid';
  rate_per_ms: number;
  mid_mV: number;
  scale_mV: number;
}

/**
 * r = rate · x / (1 − exp(−x)), x = (V − mid)/scale. The 0/0 at V = mid is removable: r → rate.
 * Hodgkin & Huxley's αm and αn, and the Traub-type rates in Pospischil et al. 2008, have this form.
 */
export interface ExpLinearForm {
  form: 'exp-linear';
  rate_per_ms: number;
  mid_mV: number;
  scale_mV: number;
}

export type RateForm = ExponentialForm | SigmoidForm | ExpLinearForm;

/** τ = constant. */
export interface ConstantTau {
  form: 'constant';
  tau_ms: number;
}

/** τ = scale / (rise · exp((V − mid)/riseScale) + fall · exp(−(V − mid)/fallScale)), a bell-shaped τ(V). */
export interface BellTau {
  form: 'bell';
  scale_ms: number;
  mid_mV: number;
  rise: number;
  riseScale_mV: number;
  fall: number;
  fallScale_mV: number;
}

/** τ = tau / (1 + exp(−(V − mid)/scale)), a sigmoid τ(V) (the slow Kdr inactivation of the DRG preset). */
export interface SigmoidTau {
  form: 'sigmoid-tau';
  tau_ms: number;
  mid_mV: number;
  scale_mV: number;
}

export type TauForm = ConstantTau | BellTau | SigmoidTau;

/** Below this |x| the exp-linear form uses its series 1 + x/2 + x²/12 (error < 1e-13). */
const EXP_LINEAR_SERIES_LIMIT = 1e-4;

/** x / (1 − e^(−x)), finite and smooth through x = 0. */
export function expLinear(x: number): number {
  if (Math.abs(x) < EXP_LINEAR_SERIES_LIMIT) return 1 + x / 2 + (x * x) / 12;
  return x / -Math.expm1(-x);
}

/** Evaluate a rate form at V (mV), in 1/ms. */
export function evaluateRate(f: RateForm, v_mV: number): number {
  const x = (v_mV - f.mid_mV) / f.scale_mV;
  switch (f.form) {
    case 'exponential':
      return f.rate_per_ms * Math.exp(x);
    case 'sigmoid':
      return f.rate_per_ms / (1 + Math.exp(-x));
    case 'exp-linear':
      return f.rate_per_ms * expLinear(x);
  }
}

/** Evaluate a time-constant form at V (mV), in ms. */
export function evaluateTau(f: TauForm, v_mV: number): number {
  switch (f.form) {
    case 'constant':
      return f.tau_ms;
    case 'bell': {
      const d = v_mV - f.mid_mV;
      return f.scale_ms / (f.rise * Math.exp(d / f.riseScale_mV) + f.fall * Math.exp(-d / f.fallScale_mV));
    }
    case 'sigmoid-tau':
      return f.tau_ms / (1 + Math.exp(-(v_mV - f.mid_mV) / f.scale_mV));
  }
}
