import type { NeuronPreset } from '../types';

/**
 * Fast-spiking hippocampal interneuron of Wang & Buzsáki 1996 ("Gamma oscillation by synaptic
 * inhibition in a hippocampal interneuronal network model", J Neurosci 16:6402–6413), single
 * compartment, per cm². Every number below is from the paper's Methods (the model equations of the
 * single cell); the equation forms were written from memory of that section and checked against the
 * behaviour the paper reports (tests/unit/neuron-wang-buzsaki-1996.test.ts).
 *
 *   C dV/dt = I_app − gNa·m∞³·h·(V − E_Na) − gK·n⁴·(V − E_K) − gL·(V − E_L)
 *   m∞ = αm/(αm + βm), instantaneous:  αm = 0.1(V + 35)/(1 − e^(−(V+35)/10)),  βm = 4 e^(−(V+60)/18)
 *   dh/dt = φ(αh(1 − h) − βh·h):        αh = 0.07 e^(−(V+58)/20),            βh = 1/(1 + e^(−(V+28)/10))
 *   dn/dt = φ(αn(1 − n) − βn·n):        αn = 0.01(V + 34)/(1 − e^(−(V+34)/10)), βn = 0.125 e^(−(V+44)/80)
 *   φ = 5
 *
 * Conductance names: gNa (transient sodium, m∞³h), gK (delayed-rectifier potassium, n⁴), gL (leak).
 */
export const wangBuzsaki1996: NeuronPreset = {
  name: 'wang-buzsaki-1996',
  title: 'Fast-spiking interneuron (Wang & Buzsáki 1996)',
  reference: 'Wang & Buzsáki 1996, J Neurosci 16:6402–6413 (Methods: single-cell model)',
  capacitance_uF_cm2: 1, // WB 1996 Methods: C_m = 1 µF/cm²
  // The paper gives no temperature; its kinetics are fixed (φ = 5), so the value here only labels the preset.
  temperature_C: 6.3,
  conductances: [
    {
      name: 'gNa',
      description: 'transient sodium (m∞³h, m instantaneous)',
      g_mS_cm2: 35, // WB 1996 Methods: g_Na = 35 mS/cm²
      reversal_mV: 55, // WB 1996 Methods: E_Na = 55 mV
      blockable: true,
      rateFactor: 5, // WB 1996 Methods: φ = 5 on h (m∞ does not depend on it)
      gates: [
        {
          name: 'm',
          power: 3,
          kinetics: {
            kind: 'instantaneous',
            // αm = 0.1(V+35)/(1 − e^(−(V+35)/10)) = 1 · x/(1 − e^(−x)), x = (V+35)/10
            alpha: { form: 'exp-linear', rate_per_ms: 1, mid_mV: -35, scale_mV: 10 },
            // βm = 4 e^(−(V+60)/18)
            beta: { form: 'exponential', rate_per_ms: 4, mid_mV: -60, scale_mV: -18 },
          },
        },
        {
          name: 'h',
          power: 1,
          // Slope factor of h∞ for state-dependent block, derived here from αh, βh: h∞ = 1/2 where
          // αh = βh, at V½ = −55.31 mV; k = −1/(4·h∞′(V½)) = 6.950 mV (HH's forms moved by +7 mV).
          inactivationSlope_mV: 6.95,
          kinetics: {
            kind: 'alpha-beta',
            // αh = 0.07 e^(−(V+58)/20)
            alpha: { form: 'exponential', rate_per_ms: 0.07, mid_mV: -58, scale_mV: -20 },
            // βh = 1/(1 + e^(−(V+28)/10))
            beta: { form: 'sigmoid', rate_per_ms: 1, mid_mV: -28, scale_mV: 10 },
          },
        },
      ],
    },
    {
      name: 'gK',
      description: 'delayed-rectifier potassium (n⁴)',
      g_mS_cm2: 9, // WB 1996 Methods: g_K = 9 mS/cm²
      reversal_mV: -90, // WB 1996 Methods: E_K = −90 mV
      blockable: true,
      rateFactor: 5, // WB 1996 Methods: φ = 5 on n
      gates: [
        {
          name: 'n',
          power: 4,
          kinetics: {
            kind: 'alpha-beta',
            // αn = 0.01(V+34)/(1 − e^(−(V+34)/10)) = 0.1 · x/(1 − e^(−x)), x = (V+34)/10
            alpha: { form: 'exp-linear', rate_per_ms: 0.1, mid_mV: -34, scale_mV: 10 },
            // βn = 0.125 e^(−(V+44)/80)
            beta: { form: 'exponential', rate_per_ms: 0.125, mid_mV: -44, scale_mV: -80 },
          },
        },
      ],
    },
    {
      name: 'gL',
      description: 'leak',
      g_mS_cm2: 0.1, // WB 1996 Methods: g_L = 0.1 mS/cm²
      reversal_mV: -65, // WB 1996 Methods: E_L = −65 mV
      blockable: false,
      gates: [],
    },
  ],
};
