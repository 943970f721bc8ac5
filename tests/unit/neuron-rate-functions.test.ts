// Rate functions of the neuron presets, including the removable 0/0 points.
import { describe, expect, test } from 'vitest';
import { evaluateRate, expLinear } from '@/lib/science/neuron/rate-forms';
import { hhSquid1952 } from '@/lib/science/neuron/presets/hh-squid-1952';
import { pospischilRs2008 } from '@/lib/science/neuron/presets/pospischil-rs-2008';
import type { AlphaBetaKinetics, NeuronPreset } from '@/lib/science/neuron/types';

function kinetics(preset: NeuronPreset, conductance: string, gate: string): AlphaBetaKinetics {
  const k = preset.conductances.find((c) => c.name === conductance)?.gates.find((g) => g.name === gate)?.kinetics;
  if (!k || k.kind !== 'alpha-beta') throw new Error(`no α/β gate ${conductance}.${gate}`);
  return k;
}

// Hodgkin & Huxley 1952 rate functions as written in CHECK-VALUES.md (the NEURON hh.mod form), ms⁻¹.
const hh = {
  am: (v: number) => (0.1 * (v + 40)) / (1 - Math.exp(-(v + 40) / 10)),
  bm: (v: number) => 4 * Math.exp(-(v + 65) / 18),
  ah: (v: number) => 0.07 * Math.exp(-(v + 65) / 20),
  bh: (v: number) => 1 / (1 + Math.exp(-(v + 35) / 10)),
  an: (v: number) => (0.01 * (v + 55)) / (1 - Math.exp(-(v + 55) / 10)),
  bn: (v: number) => 0.125 * Math.exp(-(v + 65) / 80),
};

describe('Hodgkin–Huxley 1952 rates', () => {
  const m = kinetics(hhSquid1952, 'gNa', 'm');
  const h = kinetics(hhSquid1952, 'gNa', 'h');
  const n = kinetics(hhSquid1952, 'gK', 'n');

  test('αm = 1 ms⁻¹ at −40 mV and αn = 0.1 ms⁻¹ at −55 mV (limits of the 0/0, CHECK-VALUES.md)', () => {
    expect(evaluateRate(m.alpha, -40)).toBe(1);
    expect(evaluateRate(n.alpha, -55)).toBeCloseTo(0.1, 15);
  });

  test.each([-40 - 1e-9, -40 + 1e-9, -40 - 1e-5, -40 + 1e-5, -40.001, -39.999])('αm is continuous through −40 mV (V = %s)', (v) => {
    // Series of x/(1 − e^(−x)) = 1 + x/2 + x²/12 with x = (V + 40)/10 (calculus, not our code).
    const x = (v + 40) / 10;
    expect(evaluateRate(m.alpha, v)).toBeCloseTo(1 + x / 2 + (x * x) / 12, 12);
  });

  test.each([-90, -77, -65, -54.387, -30, 0, 20, 50])('every rate matches the published formula at %s mV', (v) => {
    expect(evaluateRate(m.alpha, v)).toBeCloseTo(hh.am(v), 12);
    expect(evaluateRate(m.beta, v)).toBeCloseTo(hh.bm(v), 12);
    expect(evaluateRate(h.alpha, v)).toBeCloseTo(hh.ah(v), 12);
    expect(evaluateRate(h.beta, v)).toBeCloseTo(hh.bh(v), 12);
    expect(evaluateRate(n.alpha, v)).toBeCloseTo(hh.an(v), 12);
    expect(evaluateRate(n.beta, v)).toBeCloseTo(hh.bn(v), 12);
  });

  test('preset constants are those of HH 1952 Table 3, modern convention (CHECK-VALUES.md)', () => {
    const g = Object.fromEntries(hhSquid1952.conductances.map((c) => [c.name, [c.g_mS_cm2, c.reversal_mV]]));
    expect(g).toEqual({ gNa: [120, 50], gK: [36, -77], gL: [0.3, -54.387] });
    expect(hhSquid1952.capacitance_uF_cm2).toBe(1);
    expect(hhSquid1952.temperature_C).toBe(6.3);
  });
});

describe('Pospischil et al. 2008 regular-spiking rates (V_T = −55 mV, as in the authors’ sPY_template)', () => {
  // HH_traub.mod as distributed with the paper: v2 = V − V_T; removable 0/0 where the numerator vanishes,
  // limits 0.32·4, 0.28·5 and 0.032·5 (l'Hôpital).
  const v2 = (v: number) => v + 55;
  const traub = {
    am: (v: number) => (0.32 * (13 - v2(v))) / (Math.exp((13 - v2(v)) / 4) - 1),
    bm: (v: number) => (0.28 * (v2(v) - 40)) / (Math.exp((v2(v) - 40) / 5) - 1),
    ah: (v: number) => 0.128 * Math.exp((17 - v2(v)) / 18),
    bh: (v: number) => 4 / (1 + Math.exp((40 - v2(v)) / 5)),
    an: (v: number) => (0.032 * (15 - v2(v))) / (Math.exp((15 - v2(v)) / 5) - 1),
    bn: (v: number) => 0.5 * Math.exp((10 - v2(v)) / 40),
  };
  const m = kinetics(pospischilRs2008, 'gNa', 'm');
  const h = kinetics(pospischilRs2008, 'gNa', 'h');
  const n = kinetics(pospischilRs2008, 'gK', 'n');

  test('limits at the singular points: αm(−42) = 1.28, βm(−15) = 1.4, αn(−40) = 0.16 ms⁻¹', () => {
    expect(evaluateRate(m.alpha, -42)).toBeCloseTo(1.28, 14);
    expect(evaluateRate(m.beta, -15)).toBeCloseTo(1.4, 14);
    expect(evaluateRate(n.alpha, -40)).toBeCloseTo(0.16, 14);
  });

  test.each([-100, -70.5, -55, -30, 0, 30])('every rate matches HH_traub.mod at %s mV', (v) => {
    expect(evaluateRate(m.alpha, v)).toBeCloseTo(traub.am(v), 12);
    expect(evaluateRate(m.beta, v)).toBeCloseTo(traub.bm(v), 12);
    expect(evaluateRate(h.alpha, v)).toBeCloseTo(traub.ah(v), 12);
    expect(evaluateRate(h.beta, v)).toBeCloseTo(traub.bh(v), 12);
    expect(evaluateRate(n.alpha, v)).toBeCloseTo(traub.an(v), 12);
    expect(evaluateRate(n.beta, v)).toBeCloseTo(traub.bn(v), 12);
  });

  test('conductance names and which may be blocked', () => {
    expect(pospischilRs2008.conductances.map((c) => [c.name, c.blockable])).toEqual([
      ['gNa', true],
      ['gK', true],
      ['gM', true],
      ['gL', false],
    ]);
  });
});

test('x/(1 − e^(−x)) is smooth and exact on both sides of its series switch', () => {
  // Values of x/(1 − e^(−x)) from its definition with expm1 (accurate away from 0).
  for (const x of [-1e-3, -1.0001e-4, -0.99e-4, 0, 0.99e-4, 1.0001e-4, 1e-3, 5, -5]) {
    const exact = x === 0 ? 1 : x / -Math.expm1(-x);
    expect(expLinear(x)).toBeCloseTo(exact, 14);
  }
});
