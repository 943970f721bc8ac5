// The forecast request schema: what it accepts, and the exact messages people see when it refuses.
import hhConstants from '../fixtures/check-values/hodgkin-huxley-1952.json';
import numerical from '../fixtures/check-values/hodgkin-huxley-1952-numerical.json';
import { describe, expect, test } from 'vitest';
import { computeForecast } from '@/lib/science/forecast/forecast';
import {
  describeIssues,
  forecastRequestSchema,
  parseForecastRequest,
} from '@/lib/science/forecast/request-schema';

function problems(input: unknown): string {
  const r = forecastRequestSchema.safeParse(input);
  if (r.success) return 'ok';
  return describeIssues(r.error);
}

describe('forecastRequestSchema', () => {
  test.each([
    [
      { preset: 'squid' },
      'preset: preset must be one of: hh-squid-1952, pospischil-rs-2008, wang-buzsaki-1996, xie-drg-2024',
    ],
    [
      { preset: 'wang-buzsaki-1996', block: { gM: 0.5 } },
      'block.gM: unknown conductance "gM" for preset wang-buzsaki-1996 (blockable: gNa, gK)',
    ],
    [
      { preset: 'hh-squid-1952', block: { gCa: 0.5 } },
      'block.gCa: unknown conductance "gCa" for preset hh-squid-1952 (blockable: gNa, gK)',
    ],
    [
      { preset: 'hh-squid-1952', block: { gM: 0.5 } },
      'block.gM: unknown conductance "gM" for preset hh-squid-1952 (blockable: gNa, gK)',
    ],
    [
      { preset: 'pospischil-rs-2008', block: { gL: 0.5 } },
      'block.gL: conductance "gL" of preset pospischil-rs-2008 cannot be blocked (blockable: gNa, gK, gM)',
    ],
    [{ preset: 'hh-squid-1952', block: { gNa: 1.2 } }, 'block.gNa: block fraction must be between 0 and 1'],
    [{ preset: 'hh-squid-1952', block: { gNa: -0.1 } }, 'block.gNa: block fraction must be between 0 and 1'],
    [{ preset: 'hh-squid-1952', block: { gNa: '0.3' } }, 'block.gNa: block fraction must be a number'],
    [
      { preset: 'hh-squid-1952', potencies: { gNa: { ic50: 1, hill: 1 } } },
      'concentrations: potencies need a list of concentrations',
    ],
    [
      { preset: 'hh-squid-1952', potencies: { gNa: { ic50: 0, hill: 1 } }, concentrations: [1] },
      'potencies.gNa.ic50: ic50 must be positive',
    ],
    [
      { preset: 'hh-squid-1952', potencies: { gNa: { ic50: 1, hill: 1 } }, concentrations: [-1] },
      'concentrations.0: concentrations must be ≥ 0',
    ],
    [
      {
        preset: 'hh-squid-1952',
        block: { gNa: 0.1 },
        potencies: { gNa: { ic50: 1, hill: 1 } },
        concentrations: [1],
      },
      'potencies: give either block or potencies, not both',
    ],
    [{ preset: 'hh-squid-1952', protocol: { stepMs: 5 } }, 'protocol.stepMs: stepMs must be at least 10 ms'],
    [
      { preset: 'hh-squid-1952', protocol: { drives_uA_cm2: [1, null] } },
      'protocol.drives_uA_cm2.1: each drive must be a number (µA/cm²)',
    ],
    [{ preset: 'hh-squid-1952', colour: 'red' }, '(input): Unrecognized key: "colour"'],
    ['hh-squid-1952', '(input): the forecast request must be an object'],
  ])('%j → %s', (input, message) => {
    expect(problems(input)).toBe(message);
  });

  test('every fault is reported at once', () => {
    expect(
      problems({ preset: 'hh-squid-1952', block: { gX: 0.2 }, protocol: { stepMs: 'long' } }).split('\n'),
    ).toEqual([
      'protocol.stepMs: stepMs must be a number (ms)',
      'block.gX: unknown conductance "gX" for preset hh-squid-1952 (blockable: gNa, gK)',
    ]);
  });

  test('parseForecastRequest throws with every problem in the message', () => {
    expect(() => parseForecastRequest({ preset: 'x' })).toThrow('preset: preset must be one of');
  });
});

describe('computeForecast', () => {
  test('each condition sits beside control with its shifts', () => {
    const r = computeForecast({
      preset: 'hh-squid-1952',
      block: { gNa: 0.3 },
      protocol: { drives_uA_cm2: [20] },
      trace: { points: 400 },
    });
    const c = r.conditions[0]!;
    expect(c.block).toEqual({ gNa: 0.3, gK: 0 });
    // HH 1952 Table 3 conductances (hodgkin-huxley-1952.json), gNa scaled by 1 − 0.3.
    const g = hhConstants.conductances;
    expect(c.conductances_mS_cm2).toEqual({
      gNa: g.gNa.g_mS_cm2 * 0.7,
      gK: g.gK.g_mS_cm2,
      gL: g.gL.g_mS_cm2,
    });
    const s = c.shifts.rheobase_uA_cm2;
    expect(s.control).toBe(r.control.measures.rheobase_uA_cm2);
    expect(s.value).toBe(c.measures.rheobase_uA_cm2);
    expect(s.delta).toBeCloseTo(s.value! - s.control!, 12);
    expect(s.relative).toBeCloseTo((s.value! - s.control!) / s.control!, 12);
    expect(r.referenceDrive_uA_cm2).toBeCloseTo(2 * r.control.measures.rheobase_uA_cm2!, 12);
    expect(Object.keys(c.measures.rates_Hz)).toEqual(['20']);
    expect(r.caution).toMatch(/not a clinical or regulatory safety determination/);
    // Traces: downsampled, from 20 ms before the step to 20 ms after it, spike peaks kept.
    const t = r.traces!;
    expect(t.drive_uA_cm2).toBe(r.referenceDrive_uA_cm2);
    expect(t.control.t_ms.length).toBeLessThanOrEqual(400);
    expect(t.control.t_ms[0]).toBeCloseTo(-20, 9);
    expect(t.control.t_ms[t.control.t_ms.length - 1]).toBeCloseTo(1020, 9);
    expect(Math.max(...t.control.v_mV)).toBeGreaterThan(30);
    expect(t.condition).not.toBeNull();
  });

  test('an f–I curve relative to the control rheobase is measured at the same drives for every condition', () => {
    const r = computeForecast({
      preset: 'pospischil-rs-2008',
      block: { gM: 0.5 },
      protocol: { fiCurve: { points: 4, upToFactor: 2 } },
      trace: false,
    });
    const rheobase = r.control.measures.rheobase_uA_cm2!;
    const drives = [0.5, 1, 1.5, 2].map((f) => f * rheobase);
    expect(r.control.measures.fI.map((p) => p.drive_uA_cm2)).toEqual(drives);
    expect(r.conditions[0]!.measures.fI.map((p) => p.drive_uA_cm2)).toEqual(drives);
    // Rates rise along the curve (above rheobase), and M-current block raises each of them.
    const control = r.control.measures.fI.map((p) => p.rate_Hz);
    const blocked = r.conditions[0]!.measures.fI.map((p) => p.rate_Hz);
    expect(control[3]!).toBeGreaterThan(control[2]!);
    blocked.slice(2).forEach((rate, i) => expect(rate).toBeGreaterThan(control[i + 2]!));
  });

  test('no block gives the control alone', () => {
    const r = computeForecast({ preset: 'hh-squid-1952', trace: false });
    expect(r.conditions).toEqual([]);
    expect(r.traces).toBeNull();
    expect(r.control.measures.rest_mV).toBeCloseTo(numerical.rest_mV, 3); // hodgkin-huxley-1952-numerical.json
  });
});
