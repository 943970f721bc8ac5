// Step-size convergence of the integrator: the evidence for the default dt of 0.025 ms.
import { describe, expect, test } from 'vitest';
import { measureExcitability } from '@/lib/science/neuron/excitability';
import { firingRate } from '@/lib/science/neuron/firing-rate';
import { DEFAULT_DT_MS, simulate } from '@/lib/science/neuron/integrate';
import { compileModel } from '@/lib/science/neuron/model';
import { getPreset } from '@/lib/science/neuron/presets';
import { findRest } from '@/lib/science/neuron/rest';
import { findRheobase } from '@/lib/science/neuron/rheobase';

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

// Tolerances we require of the default step (our choice): rates and rheobase move by less than
// 0.1 % and 0.05 % when dt is halved, the threshold by less than 0.1 mV. Screening potencies carry
// errors of tens of percent, so this is far below what a forecast can resolve.
describe.each([
  ['hh-squid-1952', [10, 20]],
  ['pospischil-rs-2008', [4, 10]],
  ['wang-buzsaki-1996', [2, 10]],
] as const)('%s: halving dt from the default', (preset, drives) => {
  const model = compileModel(getPreset(preset));
  const start = findRest(model).start;
  const dt = DEFAULT_DT_MS;

  test.each(drives)('rate at %s µA/cm² changes by under one part in a thousand', (drive) => {
    const coarse = firingRate(model, start, drive, { dt_ms: dt }).rate_Hz;
    const fine = firingRate(model, start, drive, { dt_ms: dt / 2 }).rate_Hz;
    expect(fine).toBeGreaterThan(0);
    expect(relative(coarse, fine)).toBeLessThan(1e-3);
  });

  test('rheobase changes by under 0.05 % and threshold by under 0.1 mV', () => {
    const tight = { rheobaseRelTolerance: 1e-5 };
    const coarse = measureExcitability(model, { protocol: { ...tight, dt_ms: dt } });
    const fine = measureExcitability(model, { protocol: { ...tight, dt_ms: dt / 2 } });
    expect(relative(coarse.rheobase_uA_cm2!, fine.rheobase_uA_cm2!)).toBeLessThan(5e-4);
    expect(Math.abs(coarse.threshold_mV! - fine.threshold_mV!)).toBeLessThan(0.1);
  });
});

test('the scheme is second order: the period error falls fourfold per halving (HH, 8 µA/cm²)', () => {
  const model = compileModel(getPreset('hh-squid-1952'));
  const start = findRest(model).start;
  const period = (dt: number) => {
    const warm = simulate(model, start, { current_uA_cm2: 8, duration_ms: 300 }, { dt_ms: dt }).end;
    const s = simulate(
      model,
      warm,
      { current_uA_cm2: 8, duration_ms: 1000 },
      { dt_ms: dt },
    ).spikeTimes_ms.filter((t) => t > 200);
    return (s[s.length - 1]! - s[0]!) / (s.length - 1);
  };
  const [p1, p2, p3] = [0.05, 0.025, 0.0125].map(period) as [number, number, number];
  const ratio = (p1 - p2) / (p2 - p3);
  expect(ratio).toBeGreaterThan(3.5);
  expect(ratio).toBeLessThan(4.5);
});

test('tabulated rates agree with rates evaluated at every step', () => {
  // The tables (0.02 mV grid, linear interpolation) must not be what limits accuracy.
  for (const preset of ['hh-squid-1952', 'pospischil-rs-2008']) {
    const model = compileModel(getPreset(preset));
    const start = findRest(model).start;
    const table = firingRate(model, start, 10, { rates: 'table' }).rate_Hz;
    const exact = firingRate(model, start, 10, { rates: 'exact' }).rate_Hz;
    expect(relative(table, exact)).toBeLessThan(1e-5);
    const rTable = findRheobase(model, start, { rates: 'table', relTolerance: 1e-6 }).rheobase_uA_cm2!;
    const rExact = findRheobase(model, start, { rates: 'exact', relTolerance: 1e-6 }).rheobase_uA_cm2!;
    expect(relative(rTable, rExact)).toBeLessThan(1e-5);
  }
});

describe('rheobase search', () => {
  test.each(['hh-squid-1952', 'pospischil-rs-2008'])(
    '%s: the coarse-then-confirm search brackets the same rheobase as a search at dt alone',
    (preset) => {
      const model = compileModel(getPreset(preset));
      const start = findRest(model).start;
      const direct = findRheobase(model, start, { coarseDtFactor: 1 });
      const staged = findRheobase(model, start, { coarseDtFactor: 4 });
      const [lo1, hi1] = direct.bracket!;
      const [lo4, hi4] = staged.bracket!;
      // Both brackets are at dt, within 0.1 %, and hold the rheobase at dt: they must overlap.
      expect(hi4 - lo4).toBeLessThanOrEqual(1e-3 * hi4);
      expect(Math.max(lo1, lo4)).toBeLessThan(Math.min(hi1, hi4));
      expect(staged.steps).toBeLessThanOrEqual(direct.steps + 4);
    },
  );

  test('no spike up to the ceiling gives no rheobase', () => {
    const model = compileModel(getPreset('hh-squid-1952'), { gNa: 0 });
    const r = findRheobase(model, findRest(model).start, { ceiling_uA_cm2: 5 });
    expect(r.rheobase_uA_cm2).toBeNull();
    expect(r.bracket).toBeNull();
  });
});
