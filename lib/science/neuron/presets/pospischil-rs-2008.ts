import type { NeuronPreset } from '../types';

/**
 * Regular-spiking cortical pyramidal cell, single compartment, of Pospischil et al. 2008
 * ("Minimal Hodgkin–Huxley type models for different classes of cortical and thalamic neurons",
 * Biol Cybern 99:427–441). Numbers are those of the authors' own regular-spiking demonstration cell
 * distributed with the paper (ModelDB; files sPY_template, HH_traub.mod, IM_cortex.mod), read from
 * a public copy of that code; the ModelDB accession (123623) is from memory. The paper's per-cell fits in its figures use other values
 * (for example V_T = −56.2 mV; from memory), so this preset is "the distributed RS cell".
 *
 *   C dV/dt = I − gNa·m³h·(V − E_Na) − gK·n⁴·(V − E_K) − gM·p·(V − E_K) − gL·(V − E_L)
 *   Traub-type rates (HH_traub.mod), v2 = V − V_T, each α and β × 3^((T − 36)/10):
 *   αm = 0.32(13 − v2)/(e^((13−v2)/4) − 1),   βm = 0.28(v2 − 40)/(e^((v2−40)/5) − 1)
 *   αh = 0.128 e^((17 − v2)/18),               βh = 4/(1 + e^((40 − v2)/5))
 *   αn = 0.032(15 − v2)/(e^((15−v2)/5) − 1),   βn = 0.5 e^((10 − v2)/40)
 *   dp/dt = (p∞ − p)/τp (IM_cortex.mod):  p∞ = 1/(1 + e^(−(V+35)/10)),
 *   τp = τmax/(3.3 e^((V+35)/20) + e^(−(V+35)/20)) / 2.3^((T − 36)/10)
 *
 * The authors' cell is one compartment with L = d = 96 µm (sPY_template: "area is about 29000 um2";
 * π·96·96 = 28953 µm²), so 1 nA injected there is 3.454 µA/cm² here, and its leak alone is the
 * template's "Rin = 34 Meg". Their demonstration (demo_PY_RS.hoc) is a 0.75 nA step of 400 ms from
 * −70 mV. Checked against the code and an outside run of it in tests/unit/neuron-pospischil-rs-2008.test.ts.
 * Conductance names: gNa (transient sodium, m³h), gK (delayed-rectifier potassium, n⁴),
 * gM (slow non-inactivating M-type potassium, p), gL (leak).
 */

/** V_T, the threshold-adjusting offset of the Traub-type rates: sPY_template, vtraub_hh2 = −55 mV. */
const VT_mV = -55;

export const pospischilRs2008: NeuronPreset = {
  name: 'pospischil-rs-2008',
  title: 'Cortical regular-spiking neuron (Pospischil et al. 2008), 36 °C',
  reference: 'Pospischil et al. 2008, Biol Cybern 99:427–441; authors’ RS cell (sPY_template)',
  capacitance_uF_cm2: 1, // sPY_template: cm = 1 µF/cm²
  temperature_C: 36, // sPY demo: celsius = 36, the reference temperature of both channel files
  conductances: [
    {
      name: 'gNa',
      description: 'transient sodium (m³h)',
      g_mS_cm2: 50, // sPY_template: gnabar_hh2 = 0.05 S/cm²
      reversal_mV: 50, // sPY_template: v_sodium = 50 mV
      blockable: true,
      q10: 3, // HH_traub.mod: tadj = 3^((celsius − 36)/10)
      referenceTemperature_C: 36, // HH_traub.mod: tadj = 1 at 36 °C
      gates: [
        {
          name: 'm',
          power: 3,
          kinetics: {
            kind: 'alpha-beta',
            // αm = 0.32(13 − v2)/(e^((13 − v2)/4) − 1), v2 = V − V_T  →  1.28 · x/(1 − e^(−x)), x = (V − V_T − 13)/4
            alpha: { form: 'exp-linear', rate_per_ms: 1.28, mid_mV: VT_mV + 13, scale_mV: 4 },
            // βm = 0.28(v2 − 40)/(e^((v2 − 40)/5) − 1)  →  1.4 · x/(1 − e^(−x)), x = −(V − V_T − 40)/5
            beta: { form: 'exp-linear', rate_per_ms: 1.4, mid_mV: VT_mV + 40, scale_mV: -5 },
          },
        },
        {
          name: 'h',
          power: 1,
          // Slope factor of h∞ for state-dependent block, derived here from αh, βh: h∞ = 1/2 where
          // αh = βh, at V½ = −33.37 mV (V_T = −55 mV); k = −1/(4·h∞′(V½)) = 3.990 mV.
          inactivationSlope_mV: 3.99,
          kinetics: {
            kind: 'alpha-beta',
            // αh = 0.128 e^((17 − v2)/18)
            alpha: { form: 'exponential', rate_per_ms: 0.128, mid_mV: VT_mV + 17, scale_mV: -18 },
            // βh = 4/(1 + e^((40 − v2)/5))
            beta: { form: 'sigmoid', rate_per_ms: 4, mid_mV: VT_mV + 40, scale_mV: 5 },
          },
        },
      ],
    },
    {
      name: 'gK',
      description: 'delayed-rectifier potassium (n⁴)',
      g_mS_cm2: 5, // sPY_template: gkbar_hh2 = 0.005 S/cm²
      reversal_mV: -100, // sPY_template: v_potassium = −100 mV
      blockable: true,
      q10: 3, // HH_traub.mod: tadj = 3^((celsius − 36)/10)
      referenceTemperature_C: 36, // HH_traub.mod: tadj = 1 at 36 °C
      gates: [
        {
          name: 'n',
          power: 4,
          kinetics: {
            kind: 'alpha-beta',
            // αn = 0.032(15 − v2)/(e^((15 − v2)/5) − 1)  →  0.16 · x/(1 − e^(−x)), x = (V − V_T − 15)/5
            alpha: { form: 'exp-linear', rate_per_ms: 0.16, mid_mV: VT_mV + 15, scale_mV: 5 },
            // βn = 0.5 e^((10 − v2)/40)
            beta: { form: 'exponential', rate_per_ms: 0.5, mid_mV: VT_mV + 10, scale_mV: -40 },
          },
        },
      ],
    },
    {
      name: 'gM',
      description: 'slow non-inactivating M-type potassium (p)',
      g_mS_cm2: 0.07, // sPY_template: gkbar_im = 7e-5 S/cm²
      reversal_mV: -100, // sPY_template: ek = v_potassium = −100 mV
      blockable: true,
      q10: 2.3, // IM_cortex.mod: tadj = 2.3^((celsius − 36)/10)
      referenceTemperature_C: 36, // IM_cortex.mod: tadj = 1 at 36 °C
      gates: [
        {
          name: 'p',
          power: 1,
          kinetics: {
            kind: 'inf-tau',
            // p∞ = 1/(1 + e^(−(V + 35)/10))   (IM_cortex.mod)
            inf: { form: 'sigmoid', rate_per_ms: 1, mid_mV: -35, scale_mV: 10 },
            // τp = τmax/(3.3 e^((V + 35)/20) + e^(−(V + 35)/20)), τmax = 1000 ms (sPY_template: taumax_im)
            tau: {
              form: 'bell',
              scale_ms: 1000,
              mid_mV: -35,
              rise: 3.3,
              riseScale_mV: 20,
              fall: 1,
              fallScale_mV: 20,
            },
          },
        },
      ],
    },
    {
      name: 'gL',
      description: 'leak',
      g_mS_cm2: 0.1, // sPY_template: g_pas = 1e-4 S/cm²
      reversal_mV: -70, // sPY_template: e_pas = −70 mV
      blockable: false,
      gates: [],
    },
  ],
};
