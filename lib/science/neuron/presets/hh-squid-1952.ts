import type { NeuronPreset } from '../types';

/**
 * Hodgkin–Huxley 1952 squid giant axon, modern sign convention (rest near −65 mV), 6.3 °C.
 * Conductances and reversal potentials: Hodgkin & Huxley 1952, J Physiol 117:500–544, Table 3,
 * re-expressed with V = −65 mV + displacement. Rate functions (ms⁻¹, V in mV): the paper's, moved to
 * that convention, in the form used by the NEURON simulator's hh.mod; every α and β is multiplied by
 * φ = 3^((T − 6.3)/10), the paper's temperature factor (1 at its 6.3 °C).
 *
 *   C dV/dt = I − gNa·m³h·(V − E_Na) − gK·n⁴·(V − E_K) − gL·(V − E_L)
 *   dx/dt = φ·(αx(1 − x) − βx·x)  for x = m, h, n
 *   αm = 0.1(V + 40)/(1 − e^(−(V+40)/10)),   βm = 4 e^(−(V+65)/18)
 *   αh = 0.07 e^(−(V+65)/20),                βh = 1/(1 + e^(−(V+35)/10))
 *   αn = 0.01(V + 55)/(1 − e^(−(V+55)/10)),  βn = 0.125 e^(−(V+65)/80)
 *
 * Conductance names: gNa (transient sodium, m³h), gK (delayed-rectifier potassium, n⁴), gL (leak).
 * Checked against published behaviour in tests/unit/neuron-hh-reference.test.ts.
 */
export const hhSquid1952: NeuronPreset = {
  name: 'hh-squid-1952',
  title: 'Hodgkin–Huxley squid axon (1952), 6.3 °C',
  reference: 'Hodgkin & Huxley 1952, J Physiol 117:500–544 (Table 3; modern convention)',
  capacitance_uF_cm2: 1, // HH 1952 Table 3
  temperature_C: 6.3, // HH 1952: the rate equations are stated for 6.3 °C
  conductances: [
    {
      name: 'gNa',
      description: 'transient sodium (m³h)',
      g_mS_cm2: 120, // HH 1952 Table 3
      reversal_mV: 50, // HH 1952 Table 3: E_Na = −115 mV displacement, i.e. +50 mV
      blockable: true,
      q10: 3, // HH 1952: φ = 3^((T − 6.3)/10)
      referenceTemperature_C: 6.3, // HH 1952: φ = 1 at 6.3 °C
      gates: [
        {
          name: 'm',
          power: 3,
          kinetics: {
            kind: 'alpha-beta',
            // αm = 0.1(V+40)/(1 − e^(−(V+40)/10)) = 1 · x/(1 − e^(−x)), x = (V+40)/10; αm(−40) = 1
            alpha: { form: 'exp-linear', rate_per_ms: 1, mid_mV: -40, scale_mV: 10 },
            // βm = 4 e^(−(V+65)/18)
            beta: { form: 'exponential', rate_per_ms: 4, mid_mV: -65, scale_mV: -18 },
          },
        },
        {
          name: 'h',
          power: 1,
          // Slope factor of h∞ for state-dependent block, derived here from αh, βh: h∞ = 1/2 where
          // αh = βh, at V½ = −62.31 mV; k = −1/(4·h∞′(V½)) = 6.950 mV.
          inactivationSlope_mV: 6.95,
          kinetics: {
            kind: 'alpha-beta',
            // αh = 0.07 e^(−(V+65)/20)
            alpha: { form: 'exponential', rate_per_ms: 0.07, mid_mV: -65, scale_mV: -20 },
            // βh = 1/(1 + e^(−(V+35)/10))
            beta: { form: 'sigmoid', rate_per_ms: 1, mid_mV: -35, scale_mV: 10 },
          },
        },
      ],
    },
    {
      name: 'gK',
      description: 'delayed-rectifier potassium (n⁴)',
      g_mS_cm2: 36, // HH 1952 Table 3
      reversal_mV: -77, // HH 1952 Table 3: E_K = +12 mV displacement, i.e. −77 mV
      blockable: true,
      q10: 3, // HH 1952: φ = 3^((T − 6.3)/10), as for sodium
      referenceTemperature_C: 6.3, // HH 1952: φ = 1 at 6.3 °C
      gates: [
        {
          name: 'n',
          power: 4,
          kinetics: {
            kind: 'alpha-beta',
            // αn = 0.01(V+55)/(1 − e^(−(V+55)/10)) = 0.1 · x/(1 − e^(−x)), x = (V+55)/10; αn(−55) = 0.1
            alpha: { form: 'exp-linear', rate_per_ms: 0.1, mid_mV: -55, scale_mV: 10 },
            // βn = 0.125 e^(−(V+65)/80)
            beta: { form: 'exponential', rate_per_ms: 0.125, mid_mV: -65, scale_mV: -80 },
          },
        },
      ],
    },
    {
      name: 'gL',
      description: 'leak',
      g_mS_cm2: 0.3, // HH 1952 Table 3
      reversal_mV: -54.387, // HH 1952 Table 3: V_l = −10.613 mV displacement (their sign), i.e. −54.387 mV
      blockable: false,
      gates: [],
    },
  ],
};
