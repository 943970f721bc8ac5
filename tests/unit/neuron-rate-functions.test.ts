// Rate functions of the neuron presets, including the removable 0/0 points. Published formulas and
// constants come from tests/fixtures/check-values/ (hodgkin-huxley-1952*.{json,ts}, pospischil-2008-rates.ts).
import hhConstants from '../fixtures/check-values/hodgkin-huxley-1952.json';
import { hhRates_per_ms as hh } from '../fixtures/check-values/hodgkin-huxley-1952-rates';
import {
  singularLimits as traubLimits,
  traubRates_per_ms as traub,
} from '../fixtures/check-values/pospischil-2008-rates';
import { describe, expect, test } from 'vitest';
import { evaluateRate, expLinear } from '@/lib/science/neuron/rate-forms';
import { hhSquid1952 } from '@/lib/science/neuron/presets/hh-squid-1952';
import { pospischilRs2008 } from '@/lib/science/neuron/presets/pospischil-rs-2008';
import type { AlphaBetaKinetics, NeuronPreset } from '@/lib/science/neuron/types';

function kinetics(preset: NeuronPreset, conductance: string, gate: string): AlphaBetaKinetics {
  const k = preset.conductances
    .find((c) => c.name === conductance)
    ?.gates.find((g) => g.name === gate)?.kinetics;
  if (!k || k.kind !== 'alpha-beta') throw new Error(`no α/β gate ${conductance}.${gate}`);
  return k;
}

/** The m, h and n gates of a preset's sodium and potassium conductances. */
function gatesOf(preset: NeuronPreset): Record<'m' | 'h' | 'n', AlphaBetaKinetics> {
  return { m: kinetics(preset, 'gNa', 'm'), h: kinetics(preset, 'gNa', 'h'), n: kinetics(preset, 'gK', 'n') };
}

type PublishedRates = Record<
  'alphaM' | 'betaM' | 'alphaH' | 'betaH' | 'alphaN' | 'betaN',
  (v_mV: number) => number
>;

/** Each of the six rates of the m, h and n gates at v_mV against the published formula of the same name. */
function expectPublishedRates(
  gates: Record<'m' | 'h' | 'n', AlphaBetaKinetics>,
  published: PublishedRates,
  v_mV: number,
) {
  for (const gate of ['m', 'h', 'n'] as const) {
    const name = gate.toUpperCase() as 'M' | 'H' | 'N';
    expect(evaluateRate(gates[gate].alpha, v_mV), `alpha${name}`).toBeCloseTo(
      published[`alpha${name}`](v_mV),
      12,
    );
    expect(evaluateRate(gates[gate].beta, v_mV), `beta${name}`).toBeCloseTo(
      published[`beta${name}`](v_mV),
      12,
    );
  }
}

describe('Hodgkin–Huxley 1952 rates', () => {
  const gates = gatesOf(hhSquid1952);
  const { m, n } = gates;

  test('αm = 1 ms⁻¹ at −40 mV and αn = 0.1 ms⁻¹ at −55 mV (limits of the 0/0, hodgkin-huxley-1952.json)', () => {
    expect(evaluateRate(m.alpha, -40)).toBe(hhConstants.rateLimits.alphaM_at_minus40_mV_per_ms);
    expect(evaluateRate(n.alpha, -55)).toBeCloseTo(hhConstants.rateLimits.alphaN_at_minus55_mV_per_ms, 15);
  });

  test.each([-40 - 1e-9, -40 + 1e-9, -40 - 1e-5, -40 + 1e-5, -40.001, -39.999])(
    'αm is continuous through −40 mV (V = %s)',
    (v) => {
      // Series of x/(1 − e^(−x)) = 1 + x/2 + x²/12 with x = (V + 40)/10 (calculus, not our code).
      const x = (v + 40) / 10;
      expect(evaluateRate(m.alpha, v)).toBeCloseTo(1 + x / 2 + (x * x) / 12, 12);
    },
  );

  test.each([-90, -77, -65, -54.387, -30, 0, 20, 50])(
    'every rate matches the published formula (hodgkin-huxley-1952-rates.ts) at %s mV',
    (v) => {
      expectPublishedRates(gates, hh, v);
    },
  );

  test('preset constants are those of HH 1952 Table 3, modern convention (hodgkin-huxley-1952.json)', () => {
    const g = Object.fromEntries(hhSquid1952.conductances.map((c) => [c.name, [c.g_mS_cm2, c.reversal_mV]]));
    const published = Object.fromEntries(
      Object.entries(hhConstants.conductances).map(([name, c]) => [name, [c.g_mS_cm2, c.reversal_mV]]),
    );
    expect(g).toEqual(published);
    expect(hhSquid1952.capacitance_uF_cm2).toBe(hhConstants.capacitance_uF_cm2);
    expect(hhSquid1952.temperature_C).toBe(hhConstants.temperature_C);
  });
});

describe('Pospischil et al. 2008 regular-spiking rates (V_T = −55 mV, as in the authors’ sPY_template)', () => {
  // HH_traub.mod as distributed with the paper (pospischil-2008-rates.ts): v2 = V − V_T; removable 0/0
  // where the numerator vanishes, limits 0.32·4, 0.28·5 and 0.032·5 (l'Hôpital).
  const gates = gatesOf(pospischilRs2008);
  const { m, n } = gates;

  test('limits at the singular points: αm(−42) = 1.28, βm(−15) = 1.4, αn(−40) = 0.16 ms⁻¹', () => {
    const gate = { alphaM: m.alpha, betaM: m.beta, alphaN: n.alpha };
    expect(traubLimits.map((l) => l.rate)).toEqual(['alphaM', 'betaM', 'alphaN']);
    for (const l of traubLimits) expect(evaluateRate(gate[l.rate], l.v_mV)).toBeCloseTo(l.limit_per_ms, 14);
  });

  test.each([-100, -70.5, -55, -30, 0, 30])(
    'every rate matches HH_traub.mod (pospischil-2008-rates.ts) at %s mV',
    (v) => {
      expectPublishedRates(gates, traub, v);
    },
  );

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
