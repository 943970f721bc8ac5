// The Pospischil et al. 2008 regular-spiking preset against the authors' distributed cell and an outside
// simulation of it. Values and their sources are in tests/fixtures/check-values/:
// pospischil-2008-rs-cell.json (the authors' code: sPY_template, IM_cortex.mod, demo_PY_RS.hoc; published)
// and pospischil-2008-rs-reference-run.json (spike times of that cell simulated in NEURON and in its
// NeuroML 2 version by Open Source Brain; computed). The paper's own figures and tables were not at hand:
// no rheobase, f–I point or spike width printed in the paper is checked here (see the fixture notes).
import cell from '../fixtures/check-values/pospischil-2008-rs-cell.json';
import reference from '../fixtures/check-values/pospischil-2008-rs-reference-run.json';
import { describe, expect, test } from 'vitest';
import { simulate } from '@/lib/science/neuron/integrate';
import { compileModel, gateInfTau, steadyStateAt } from '@/lib/science/neuron/model';
import { getPreset } from '@/lib/science/neuron/presets';
import { pospischilRs2008 } from '@/lib/science/neuron/presets/pospischil-rs-2008';

const model = compileModel(pospischilRs2008);
const byName = Object.fromEntries(pospischilRs2008.conductances.map((c) => [c.name, c]));

/** Membrane area of the template's cylinder, L = d = 96 µm (its ends carry no membrane in NEURON), cm². */
const area_cm2 = Math.PI * cell.diameter_um * cell.length_um * 1e-8;
/** A current in nA as a density over that area, µA/cm². */
const density = (nA: number) => (nA * 1e-3) / area_cm2;

describe('parameters of the authors’ RS cell (pospischil-2008-rs-cell.json: sPY_template, IM_cortex.mod)', () => {
  test('is the preset of that name, with the code’s conductances, reversals, capacitance and temperature', () => {
    expect(getPreset('pospischil-rs-2008')).toBe(pospischilRs2008);
    for (const [name, g] of Object.entries(cell.conductances_mS_cm2)) expect(byName[name]?.g_mS_cm2).toBe(g);
    for (const [name, e] of Object.entries(cell.reversal_mV)) expect(byName[name]?.reversal_mV).toBe(e);
    expect(pospischilRs2008.capacitance_uF_cm2).toBe(cell.capacitance_uF_cm2);
    expect(pospischilRs2008.temperature_C).toBe(cell.temperature_C);
  });

  // IM_cortex.mod written out here: m∞ = 1/(1 + e^(−(V+35)/10)), τ = τmax/(3.3 e^((V+35)/20) + e^(−(V+35)/20)),
  // with τmax = taumax_im = 1000 ms at 36 °C, where the code's factor 2.3^((celsius − 36)/10) is 1.
  test.each([-100.2, -70.6, -55, -35, -20.3, 0, 30.1])(
    'M current at %s mV: p∞ and τp as in IM_cortex.mod',
    (v) => {
      const out = new Float64Array(2);
      const p = model.gates.find((g) => g.label === 'gM.p')!;
      gateInfTau(p, v, out);
      expect(out[0]).toBeCloseTo(1 / (1 + Math.exp(-(v + 35) / 10)), 12);
      const tau = cell.imTauMax_ms / (3.3 * Math.exp((v + 35) / 20) + Math.exp(-(v + 35) / 20));
      expect(out[1]).toBeCloseTo(tau, 9);
    },
  );

  test('the sodium and potassium rates sit on V_T = vtraub_hh2 = −55 mV', () => {
    // αm's removable 0/0 is at V_T + 13 and αn's at V_T + 15 (HH_traub.mod); the full rate functions are
    // checked in neuron-rate-functions.test.ts.
    const [m, , n] = pospischilRs2008.conductances.flatMap((c) => c.gates);
    expect(m!.kinetics.kind === 'alpha-beta' && m!.kinetics.alpha.mid_mV).toBe(cell.vtraub_mV + 13);
    expect(n!.kinetics.kind === 'alpha-beta' && n!.kinetics.alpha.mid_mV).toBe(cell.vtraub_mV + 15);
  });

  test(`the leak over the template’s area is its stated ${cell.statedLeakInputResistance_MOhm} MΩ (sPY_template: “Rin = 34 Meg”)`, () => {
    // The template says its cylinder's area is "about 29000 um2": π·96·96 = 28953 µm², within 0.2 %.
    expect(Math.abs(area_cm2 * 1e8 - cell.statedArea_um2) / cell.statedArea_um2).toBeLessThan(0.002);
    // 1/(gL · area) with gL in S/cm²: 34.5 MΩ over the stated area. The comment gives whole MΩ, so ±0.5 MΩ;
    // over the exact area it is 34.54, still within rounding of both stated numbers (34 and 29000).
    const leak_S_cm2 = byName.gL!.g_mS_cm2 * 1e-3;
    const overStated_MOhm = 1 / (leak_S_cm2 * cell.statedArea_um2 * 1e-8) / 1e6;
    expect(Math.abs(overStated_MOhm - cell.statedLeakInputResistance_MOhm)).toBeLessThan(0.5);
    const overExact_MOhm = 1 / (leak_S_cm2 * area_cm2) / 1e6;
    expect(Math.abs(overExact_MOhm - cell.statedLeakInputResistance_MOhm)).toBeLessThan(0.6);
  });

  test('the demonstration protocol is the one the reference run used', () => {
    expect(reference.initialV_mV).toBe(cell.demo.initialV_mV);
    expect([reference.stepStart_ms, reference.stepDuration_ms, reference.stepAmplitude_nA]).toEqual([
      cell.demo.stepStart_ms,
      cell.demo.stepDuration_ms,
      cell.demo.stepAmplitude_nA,
    ]);
  });
});

describe('the demonstration step, 0.75 nA for 400 ms (pospischil-2008-rs-reference-run.json)', () => {
  // From V = −70 mV with every gate at its steady state, 300 ms at rest, the step, then 300 ms at rest.
  const start = steadyStateAt(model, reference.initialV_mV);
  const before = simulate(model, start, { current_uA_cm2: 0, duration_ms: reference.stepStart_ms });
  const during = simulate(model, before.end, {
    current_uA_cm2: density(reference.stepAmplitude_nA),
    duration_ms: reference.stepDuration_ms,
    spikeLevel_mV: reference.spikeLevel_mV,
  });
  const after = simulate(model, during.end, { current_uA_cm2: 0, duration_ms: 300 });
  const spikes = during.spikeTimes_ms.map((t) => t + reference.stepStart_ms);
  const intervals = (times: number[]) => times.slice(1).map((t, i) => t - times[i]!);

  test('0.75 nA over the template’s area is 2.590 µA/cm²', () => {
    expect(density(0.75)).toBeCloseTo(2.5904, 4);
  });

  test(`fires ${reference.spikeTimes_ms.length} spikes during the step and none at rest before or after`, () => {
    expect(before.spikeTimes_ms).toEqual([]);
    expect(spikes).toHaveLength(reference.spikeTimes_ms.length);
    expect(after.spikeTimes_ms).toEqual([]);
  });

  // Tolerances. The reference values are simulations whose step is not stated beside them (fixture notes);
  // ours is second order at the default 0.025 ms. The first spike: the NEURON and NeuroML runs agree to
  // 0.001 ms and halving our step moves it by under 0.005 ms, so 0.02 ms. The intervals of an adapting
  // train magnify small differences (each later spike waits on the slow M current): going from our
  // 0.025 ms step to 0.005 ms moves the last interval by 0.16 %, and the two converged solutions still
  // differ by about 0.15 % there; we accept 0.5 % on each interval. A 2 % change in gM, gK, gL, τmax, or
  // 0.5 °C of temperature moves at least one interval by more than that.
  test(`first spike at ${reference.spikeTimes_ms[0]} ms, within 0.02 ms`, () => {
    expect(Math.abs(spikes[0]! - reference.spikeTimes_ms[0]!)).toBeLessThanOrEqual(0.02);
  });

  test(`adapting intervals ${intervals(reference.spikeTimes_ms)
    .map((t) => t.toFixed(2))
    .join(', ')} ms, each within 0.5 %`, () => {
    const expected = intervals(reference.spikeTimes_ms);
    const got = intervals(spikes);
    expect(got).toHaveLength(expected.length);
    got.forEach((isi, i) => expect(Math.abs(isi - expected[i]!) / expected[i]!).toBeLessThanOrEqual(0.005));
    // Spike-frequency adaptation, the behaviour the paper builds the RS cell for: every interval longer.
    for (let i = 1; i < got.length; i++) expect(got[i]!).toBeGreaterThan(got[i - 1]!);
  });
});
