import type { SigmoidForm } from '../rate-forms';
import type { NeuronPreset } from '../types';

/**
 * Small DRG (nociceptor) neuron at 0 days in vitro, single compartment, with separate Nav1.7 and
 * Nav1.8 conductances: the model of Xie, Yang, Ratté & Prescott, "Similar excitability through
 * different sodium channels and implications for the analgesic efficacy of selective drugs", eLife
 * 2024 (authors, title and year from memory). Every number below is from the model code distributed
 * with the paper (MATLAB, smallDRG_DIV0.m, "last updated Aug. 25, 2022"; its README ties it to the
 * paper's Figs 2D, 3D, 4A and S4), read from a public copy; the channel sources are those the code
 * names. Gatewell leaves out the code's Ornstein–Uhlenbeck current noise (σ 0.05 µA/cm², τ 5 ms), so
 * this preset is the noise-free cell. Temperature factors the code applies are folded into the
 * constants (derivations beside them); the code runs at 25 °C.
 *
 *   C dV/dt = I_hold + I − gNav17·m7³h7·(V − E_Na) − gNav18·m8³h8·(V − E_Na) − gK·n³l·(V − E_K)
 *             − gM·p·(V − E_K) − gAHP·z·(V − E_K) − gL·(V − E_L)
 *
 * Sphere of radius 11.63 µm (area 1699.69 µm²), 17 pF, holding current −3 pA: per area C = 1.00018
 * µF/cm² and I_hold = −0.17650 µA/cm². The code converts pA to µA/cm² by this area, so a drive of
 * x pA is x · 5.8834e-4 µA/cm².
 * Conductance names: gNav17 (Nav1.7, m³h), gNav18 (Nav1.8, m³h), gK (delayed rectifier, n³l),
 * gM (M-type K, p), gAHP (slow AHP K, z), gL (leak).
 */

/** Sphere of the code's radius 11.63 µm: area in cm². */
const AREA_cm2 = 4 * Math.PI * 11.63 ** 2 * 1e-8;
/** F/(RT) per mV at 25 °C, with the code's constants F = 9.648e4, R = 8.315, T = 273.16 + 25. */
const F_RT_per_mV = 9.648e4 / (8.315 * (273.16 + 25)) / 1000;
/** The code's Kdr temperature factor 3^((25 − 30)/10). */
const KDR_Q10 = 3 ** ((25 - 30) / 10);
/** The code's M-current temperature factor 3^((25 − 23.5)/10). */
const KM_TADJ = 3 ** ((25 - 23.5) / 10);

/** r = rate/(1 + exp(−(V − mid)/scale)): the code's a/(1 + exp((v − mid)/s)) is scale = −s. */
const sigmoid = (rate_per_ms: number, mid_mV: number, scale_mV: number): SigmoidForm => ({
  form: 'sigmoid',
  rate_per_ms,
  mid_mV,
  scale_mV,
});

export const xieDrg2024: NeuronPreset = {
  name: 'xie-drg-2024',
  title: 'Small DRG nociceptor, Nav1.7 and Nav1.8 (Xie et al. 2024), 0 days in vitro',
  reference:
    'Xie, Yang, Ratté & Prescott 2024, eLife (from memory); model code smallDRG_DIV0.m distributed with the paper',
  // smallDRG_DIV0.m: Cr = 17 pF over the sphere's area, ×100 to µF/cm².
  capacitance_uF_cm2: (17 / (AREA_cm2 * 1e8)) * 100,
  temperature_C: 25, // smallDRG_DIV0.m: celsius = 25 in the K-current temperature factors
  // smallDRG_DIV0.m: Ihold = −3 pA, converted by the code as (−3e-6 µA)/(area in cm²).
  holdingCurrent_uA_cm2: -3e-6 / AREA_cm2,
  conductances: [
    {
      name: 'gNav17',
      description: 'Nav1.7 sodium (m³h), Vasylyev et al. 2014 kinetics shifted by −4.2 mV',
      g_mS_cm2: 3, // smallDRG_DIV0.m: g_nav1p7 = 3 ("native")
      reversal_mV: 50, // smallDRG_DIV0.m: Ena = 50 mV
      blockable: true,
      gates: [
        {
          name: 'm',
          power: 3,
          kinetics: {
            kind: 'alpha-beta',
            // αm = 10.22/(1 + exp((V − (−7.19 − 4.2))/−15.43))  (code: Vasylyev et al. 2014, junction potential 4.2 mV)
            alpha: sigmoid(10.22, -7.19 - 4.2, 15.43),
            // βm = 23.76/(1 + exp((V − (−70.37 − 4.2))/14.53))
            beta: sigmoid(23.76, -70.37 - 4.2, -14.53),
          },
        },
        {
          name: 'h',
          power: 1,
          // Slope factor of h∞ for state-dependent block, derived here from αh, βh: h∞ = 1/2 at
          // V½ = −76.78 mV; k = −1/(4·h∞′(V½)) = 5.662 mV.
          inactivationSlope_mV: 5.662,
          kinetics: {
            kind: 'alpha-beta',
            // αh = 0.0744/(1 + exp((V − (−99.76 − 4.2))/11.07))
            alpha: sigmoid(0.0744, -99.76 - 4.2, -11.07),
            // βh = 2.54/(1 + exp((V − (−7.8 − 4.2))/−10.68))
            beta: sigmoid(2.54, -7.8 - 4.2, 10.68),
          },
        },
      ],
    },
    {
      name: 'gNav18',
      description: 'Nav1.8 sodium (m³h), Han et al. 2015 kinetics shifted by −5.3 mV',
      g_mS_cm2: 30, // smallDRG_DIV0.m: g_nav1p8 = 30 ("native")
      reversal_mV: 50, // smallDRG_DIV0.m: Ena = 50 mV
      blockable: true,
      gates: [
        {
          name: 'm',
          power: 3,
          kinetics: {
            kind: 'alpha-beta',
            // αm = 7.21/(1 + exp((V − (0.063 − 5.3))/−7.86))  (code: Han et al. 2015, after junction-potential correction)
            alpha: sigmoid(7.21, 0.063 - 5.3, 7.86),
            // βm = 7.4/(1 + exp((V − (−53.06 − 5.3))/19.34))
            beta: sigmoid(7.4, -53.06 - 5.3, -19.34),
          },
        },
        {
          name: 'h',
          power: 1,
          // Slope factor of h∞ for state-dependent block, derived here from αh, βh: h∞ = 1/2 at
          // V½ = −35.11 mV; k = −1/(4·h∞′(V½)) = 5.851 mV.
          inactivationSlope_mV: 5.851,
          kinetics: {
            kind: 'alpha-beta',
            // αh = 1.63/(1 + exp((V − (−68.5 − 5.3))/10.01))
            alpha: sigmoid(1.63, -68.5 - 5.3, -10.01),
            // βh = 0.81/(1 + exp((V − (11.44 − 5.3))/−13.12))
            beta: sigmoid(0.81, 11.44 - 5.3, 13.12),
          },
        },
      ],
    },
    {
      name: 'gK',
      description: 'delayed-rectifier potassium (n³l), Borg-Graham 1987 form',
      g_mS_cm2: 3.5, // smallDRG_DIV0.m: gKdr = 3.5
      reversal_mV: -90, // smallDRG_DIV0.m: Ek = −90 mV
      blockable: true,
      gates: [
        {
          name: 'n',
          power: 3,
          kinetics: {
            kind: 'inf-tau',
            // n∞ = 1/(1 + αn), αn = exp(−5·(V + 32)·F/RT)
            inf: sigmoid(1, -32, 1 / (5 * F_RT_per_mV)),
            // τn = βn/(q10·0.03·(1 + αn)), βn = exp(−5·0.4·(V + 32)·F/RT)
            //    = (1/(q10·0.03)) / (exp(2(V + 32)F/RT) + exp(−3(V + 32)F/RT))
            tau: {
              form: 'bell',
              scale_ms: 1 / (KDR_Q10 * 0.03),
              mid_mV: -32,
              rise: 1,
              riseScale_mV: 1 / (2 * F_RT_per_mV),
              fall: 1,
              fallScale_mV: 1 / (3 * F_RT_per_mV),
            },
          },
        },
        {
          name: 'l',
          power: 1,
          kinetics: {
            kind: 'inf-tau',
            // l∞ = 1/(1 + αl), αl = exp(2·(V + 61)·F/RT)
            inf: sigmoid(1, -61, -1 / (2 * F_RT_per_mV)),
            // τl = βl/(q10·0.001·(1 + αl)), βl = αl  →  (1/(q10·0.001)) / (1 + exp(−2(V + 61)F/RT))
            tau: {
              form: 'sigmoid-tau',
              tau_ms: 1 / (KDR_Q10 * 0.001),
              mid_mV: -61,
              scale_mV: 1 / (2 * F_RT_per_mV),
            },
          },
        },
      ],
    },
    {
      name: 'gM',
      description: 'M-type potassium (p)',
      g_mS_cm2: 0.05, // smallDRG_DIV0.m: gKm = 0.05
      reversal_mV: -90, // smallDRG_DIV0.m: Ek = −90 mV
      blockable: true,
      gates: [
        {
          name: 'p',
          power: 1,
          kinetics: {
            kind: 'inf-tau',
            // p∞ = 1/(1 + exp(−(V + 35)/5))  (smallDRG_DIV0.m, M current)
            inf: sigmoid(1, -35, 5),
            // τp = 1000/(3.3(exp((V + 35)/10) + exp(−(V + 35)/10)))/tadj, tadj = 3^((25 − 23.5)/10)
            tau: {
              form: 'bell',
              scale_ms: 1000 / 3.3 / KM_TADJ,
              mid_mV: -35,
              rise: 1,
              riseScale_mV: 10,
              fall: 1,
              fallScale_mV: 10,
            },
          },
        },
      ],
    },
    {
      name: 'gAHP',
      description: 'slow afterhyperpolarisation potassium (z), Prescott et al. 2008 form',
      g_mS_cm2: 2.5, // smallDRG_DIV0.m: gAHP = 2.5
      reversal_mV: -90, // smallDRG_DIV0.m: Ek = −90 mV
      blockable: true,
      gates: [
        {
          name: 'z',
          power: 1,
          kinetics: {
            kind: 'inf-tau',
            // z∞ = 1/(1 + exp((β_z − V)/γ_z)), smallDRG_DIV0.m: β_z = 5 mV, γ_z = 4 mV
            inf: sigmoid(1, 5, 4),
            tau: { form: 'constant', tau_ms: 100 }, // smallDRG_DIV0.m: tau_z = 100 ms
          },
        },
      ],
    },
    {
      name: 'gL',
      description: 'leak',
      g_mS_cm2: 0.025, // smallDRG_DIV0.m: gLeak = 0.025
      reversal_mV: -62.5, // smallDRG_DIV0.m: ELeak = −62.5 mV (the code: mean resting potential of DIV0 neurons)
      blockable: false,
      gates: [],
    },
  ],
};

/** µA/cm² per pA in this cell, the code's conversion amp·1e-6/(area·1e-8 cm²). */
export const XIE_DRG_2024_UA_CM2_PER_PA = 1e-6 / AREA_cm2;
