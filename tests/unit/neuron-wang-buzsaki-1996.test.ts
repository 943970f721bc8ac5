// The Wang–Buzsáki 1996 fast-spiking interneuron preset against its paper. Values and their sources are in
// tests/fixtures/check-values/: wang-buzsaki-1996.json (parameters, published) and
// wang-buzsaki-1996-from-memory.json (onset of repetitive firing, class I, rates; from memory).
import published from '../fixtures/check-values/wang-buzsaki-1996.json';
import fromMemory from '../fixtures/check-values/wang-buzsaki-1996-from-memory.json';
import { describe, expect, test } from 'vitest';
import { firingRate } from '@/lib/science/neuron/firing-rate';
import { simulate } from '@/lib/science/neuron/integrate';
import { compileModel, gateInfTau } from '@/lib/science/neuron/model';
import { getPreset } from '@/lib/science/neuron/presets';
import { wangBuzsaki1996 } from '@/lib/science/neuron/presets/wang-buzsaki-1996';
import { findRest } from '@/lib/science/neuron/rest';
import { fixedPoints } from '@/lib/science/neuron/steady-state';

const model = compileModel(wangBuzsaki1996);
const rest = findRest(model);
const byName = (name: string) => wangBuzsaki1996.conductances.find((c) => c.name === name)!;

describe('parameters (wang-buzsaki-1996.json, WB 1996 Methods)', () => {
  test('is the preset of that name, with the published conductances, reversals and capacitance', () => {
    expect(getPreset('wang-buzsaki-1996')).toBe(wangBuzsaki1996);
    expect(wangBuzsaki1996.capacitance_uF_cm2).toBe(published.capacitance_uF_cm2);
    expect([byName('gNa').g_mS_cm2, byName('gNa').reversal_mV]).toEqual([
      published.gNa_mS_cm2,
      published.ENa_mV,
    ]);
    expect([byName('gK').g_mS_cm2, byName('gK').reversal_mV]).toEqual([published.gK_mS_cm2, published.EK_mV]);
    expect([byName('gL').g_mS_cm2, byName('gL').reversal_mV]).toEqual([published.gL_mS_cm2, published.EL_mV]);
  });

  // The published rate functions written out here (wang-buzsaki-1996.json, "rates"), against the preset's data.
  const alphaM = (v: number) => (0.1 * (v + 35)) / (1 - Math.exp(-(v + 35) / 10));
  const betaM = (v: number) => 4 * Math.exp(-(v + 60) / 18);
  const alphaH = (v: number) => 0.07 * Math.exp(-(v + 58) / 20);
  const betaH = (v: number) => 1 / (1 + Math.exp(-(v + 28) / 10));
  const alphaN = (v: number) => (0.01 * (v + 34)) / (1 - Math.exp(-(v + 34) / 10));
  const betaN = (v: number) => 0.125 * Math.exp(-(v + 44) / 80);
  const voltages = [-90.3, -70.1, -58.7, -40.2, -20.9, 0.4, 30.6];

  test.each(voltages)('at %s mV: m = m∞ instantaneous; h and n relax with φ = 5', (v) => {
    const out = new Float64Array(2);
    const [m, h, n] = model.gates;
    gateInfTau(m!, v, out);
    expect(out[0]).toBeCloseTo(alphaM(v) / (alphaM(v) + betaM(v)), 12);
    expect(out[1]).toBe(0);
    gateInfTau(h!, v, out);
    expect(out[0]).toBeCloseTo(alphaH(v) / (alphaH(v) + betaH(v)), 12);
    expect(out[1]).toBeCloseTo(1 / (published.phi * (alphaH(v) + betaH(v))), 10);
    gateInfTau(n!, v, out);
    expect(out[0]).toBeCloseTo(alphaN(v) / (alphaN(v) + betaN(v)), 12);
    expect(out[1]).toBeCloseTo(1 / (published.phi * (alphaN(v) + betaN(v))), 10);
  });
});

describe('firing (wang-buzsaki-1996-from-memory.json)', () => {
  const onset = fromMemory.repetitiveFiringOnset_uA_cm2;
  const tolerance = fromMemory.onsetTolerance_uA_cm2;

  test(`rest is stable below the onset of repetitive firing, about ${onset} µA/cm² (from memory), and gone above it`, () => {
    expect(rest.rest_mV).not.toBeNull();
    expect(fixedPoints(model, onset - tolerance).some((p) => p.stable)).toBe(true);
    expect(fixedPoints(model, onset + tolerance).some((p) => p.stable)).toBe(false);
  });

  test(`class I: just above onset the cell fires tonically at a low rate (under ${fromMemory.lowRateNearOnset_below_Hz} Hz, from memory)`, () => {
    // A 4 s step: near the saddle-node the period is hundreds of ms.
    const run = simulate(model, rest.start!, { current_uA_cm2: onset + tolerance, duration_ms: 4000 });
    const late = run.spikeTimes_ms.filter((t) => t >= 2000);
    expect(late.length).toBeGreaterThanOrEqual(3);
    const rate = (1000 * (late.length - 1)) / (late[late.length - 1]! - late[0]!);
    expect(rate).toBeGreaterThan(0);
    expect(rate).toBeLessThan(fromMemory.lowRateNearOnset_below_Hz);
  });

  test('the f–I relation rises continuously with drive', () => {
    const rates = [0.5, 1, 2, 5, 10].map((drive) => firingRate(model, rest.start!, drive).rate_Hz);
    expect(rates[0]).toBeGreaterThan(0);
    for (let i = 1; i < rates.length; i++) expect(rates[i]).toBeGreaterThan(rates[i - 1]!);
  });

  const [low, high] = fromMemory.rateAt20_uA_cm2_range_Hz;
  test(`at 20 µA/cm² the rate is several hundred Hz (${low}–${high} Hz, read from the paper's figure as remembered)`, () => {
    const rate = firingRate(model, rest.start!, 20).rate_Hz;
    expect(rate).toBeGreaterThan(low!);
    expect(rate).toBeLessThan(high!);
  });
});
