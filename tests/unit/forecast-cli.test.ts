// scripts/forecast.ts end to end: a valid file prints the forecast, an invalid one names the fault.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import numerical from '../fixtures/check-values/hodgkin-huxley-1952-numerical.json';
import drg from '../fixtures/check-values/xie-drg-2024.json';
import { afterAll, describe, expect, test } from 'vitest';
import { PRESET_NAMES, conductanceNames, getPreset } from '@/lib/science/neuron/presets';
import { XIE_DRG_2024_UA_CM2_PER_PA } from '@/lib/science/neuron/presets/xie-drg-2024';

const root = resolve(__dirname, '../..');
const tsx = join(root, 'node_modules', '.bin', 'tsx');
const dir = mkdtempSync(join(tmpdir(), 'gatewell-forecast-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(content: string | null, args?: string[]) {
  const file = join(dir, 'input.json');
  if (content !== null) writeFileSync(file, content);
  const out = spawnSync(
    tsx,
    [
      join(root, 'scripts', 'forecast.ts'),
      ...(args ?? [content === null ? join(dir, 'missing.json') : file]),
    ],
    {
      encoding: 'utf8',
      cwd: root,
    },
  );
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}

describe('forecast CLI', () => {
  test('forecasts the control and prints every field', () => {
    const { code, stdout } = run(
      JSON.stringify({ preset: 'hh-squid-1952', block: {}, stepMs: 500, drives_uA_cm2: [10, 20] }),
    );
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    expect(Object.keys(out)).toEqual([
      'rest_mV',
      'rheobase_uA_cm2',
      'threshold_mV',
      'rates_Hz',
      'flags',
      'caution',
    ]);
    // HH 1952 behaviour (hodgkin-huxley-1952-numerical.json): rest −64.996 mV, rheobase ≈ 2.24, ≈ 68.3 and 86.5 Hz.
    expect(out.rest_mV).toBeCloseTo(numerical.rest_mV, 3);
    expect(Math.abs(out.rheobase_uA_cm2 - numerical.rheobase_uA_cm2)).toBeLessThanOrEqual(0.005);
    expect(Object.keys(out.rates_Hz)).toEqual(['10', '20']);
    for (const { drive_uA_cm2, rate_Hz } of numerical.ratesFromRest_Hz) {
      expect(Math.abs(out.rates_Hz[String(drive_uA_cm2)] - rate_Hz)).toBeLessThanOrEqual(0.1);
    }
    // The reference drive is twice the rheobase (about 4.5 µA/cm²), below the HH axon's onset of repetitive
    // firing (the fold of limit cycles near 6.26 µA/cm², hodgkin-huxley-1952-bifurcations.json): it fires at the start, then stops.
    expect(out.flags).toEqual(['firing-stops']);
  });

  test('30 % sodium block raises the rheobase', () => {
    const { code, stdout } = run(
      JSON.stringify({ preset: 'hh-squid-1952', block: { gNa: 0.3 }, drives_uA_cm2: [20] }),
    );
    expect(code).toBe(0);
    expect(JSON.parse(stdout).rheobase_uA_cm2).toBeGreaterThan(2.25);
  });

  // Several faults in one file are all reported, one line each.
  // State-dependent block (modulated receptor, Bean, Cohen & Tsien 1983; modulated-receptor-bean-1983.json):
  // the CLI prints tonic and state-dependent forecasts side by side with the shift of Na inactivation.
  test('potencies with an inactivated-state IC50: tonic and state-dependent side by side', () => {
    const { code, stdout, stderr } = run(
      JSON.stringify({
        preset: 'hh-squid-1952',
        potencies: { gNa: { ic50: 10, hill: 1, inactivatedIc50: 0.5 } },
        concentrations: [1],
        drives_uA_cm2: [20],
      }),
    );
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    expect(Object.keys(out)).toEqual([
      'control',
      'referenceDrive_uA_cm2',
      'conditions',
      'bandSources',
      'firingTransition',
      'caution',
    ]);
    // Without "uncertainty" no bands are drawn.
    expect(out.bandSources).toBeNull();
    expect(out.firingTransition).toBeNull();
    const [c] = out.conditions;
    expect(Object.keys(c)).toEqual([
      'concentration',
      'block',
      'inactivationShift_mV',
      'tonic',
      'stateDependent',
    ]);
    // Tonic block D/(D + Kr) = 1/11; ΔV½ = 6.95·ln(1.1/3) = −6.9729 mV (fixture, first case).
    expect(c.block.gNa).toBeCloseTo(1 / 11, 6);
    expect(c.inactivationShift_mV.gNa).toBeCloseTo(-6.9729, 4);
    expect(c.stateDependent.rheobase_uA_cm2).toBeGreaterThan(c.tonic.rheobase_uA_cm2);
    expect(c.stateDependent.rates_Hz['20']).toBeLessThan(c.tonic.rates_Hz['20']);
  });

  test.each([
    ['not JSON', '{"preset": "hh-squid-1952",', ['is not valid JSON']],
    [
      'unknown preset',
      '{"preset":"frog-heart"}',
      [`preset: preset must be one of: ${PRESET_NAMES.join(', ')}`],
    ],
    [
      'unknown or unblockable conductance',
      '{"preset":"hh-squid-1952","block":{"gM":0.5,"gL":0.5}}',
      [
        'block.gM: unknown conductance "gM" for preset hh-squid-1952 (blockable: gNa, gK)',
        'block.gL: conductance "gL" of preset hh-squid-1952 cannot be blocked',
      ],
    ],
    [
      'fraction outside 0–1 or not a number',
      '{"preset":"hh-squid-1952","block":{"gNa":1.5,"gK":-0.2}}',
      [
        'block.gNa: block fraction must be between 0 and 1',
        'block.gK: block fraction must be between 0 and 1',
      ],
    ],
    [
      'bad numbers',
      '{"preset":"pospischil-rs-2008","block":{"gM":"half"},"stepMs":"500","drives_uA_cm2":[10,null]}',
      [
        'block.gM: block fraction must be a number',
        'stepMs: stepMs must be a number (ms)',
        'drives_uA_cm2[1]: each drive must be a number (µA/cm²)',
      ],
    ],
    [
      'numbers out of range',
      '{"preset":"hh-squid-1952","stepMs":-500,"drives_uA_cm2":10}',
      ['stepMs: stepMs must be at least 10 ms', 'drives_uA_cm2: drives_uA_cm2 must be a list of numbers'],
    ],
    [
      'extra field',
      '{"preset":"hh-squid-1952","temperature":37}',
      ['(top level): Unrecognized key: "temperature"'],
    ],
    ['not an object', '[1, 2]', ['(top level): the input must be a JSON object']],
  ])('%s: exit 1 and the fault named', (_label, content, messages) => {
    const { code, stdout, stderr } = run(content);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    for (const message of messages) expect(stderr).toContain(message);
  });

  test('a missing file: exit 1', () => {
    const { code, stderr } = run(null);
    expect(code).toBe(1);
    expect(stderr).toContain('cannot read');
    expect(stderr).toContain('ENOENT');
  });

  test('wrong usage: exit 2', () => {
    const { code, stderr } = run('{}', []);
    expect(code).toBe(2);
    expect(stderr).toContain('usage: npx tsx scripts/forecast.ts FILE.json');
    // The usage text lists every preset id with its blockable conductances.
    for (const name of PRESET_NAMES) {
      expect(stderr).toContain(`  ${name}: ${conductanceNames(getPreset(name)).blockable.join(', ')}`);
    }
    expect(stderr).toContain('wang-buzsaki-1996: gNa, gK');
  });

  // The CLI passes the preset and the step on: the DRG cell's baseline rheobase for the authors' 1000 ms
  // step, 17 pA in their code with noise (xie-drg-2024.json), within the 1.5 pA of neuron-xie-drg-2024.test.ts.
  test('xie-drg-2024 with a 1000 ms step: the authors’ 17 pA rheobase', () => {
    const { code, stdout, stderr } = run(
      JSON.stringify({ preset: 'xie-drg-2024', block: {}, stepMs: drg.stepDuration_ms }),
    );
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const rheobase_pA = JSON.parse(stdout).rheobase_uA_cm2 / XIE_DRG_2024_UA_CM2_PER_PA;
    expect(Math.abs(rheobase_pA - drg.baselineRheobase_pA)).toBeLessThanOrEqual(1.5);
  });

  // Every preset id runs through the CLI: a control with a rest, a rheobase and a rate at 10 µA/cm².
  test.each(PRESET_NAMES)('preset %s runs', (preset) => {
    const { code, stdout, stderr } = run(JSON.stringify({ preset, block: {}, drives_uA_cm2: [10] }));
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    expect(out.rest_mV).toBeLessThan(-50);
    expect(out.rheobase_uA_cm2).toBeGreaterThan(0);
    expect(out.rates_Hz['10']).toBeGreaterThan(0);
  });
});

describe('forecast CLI with bands', () => {
  test('prints a band per measure and the caution; zero covariance gives the point forecast as its band', () => {
    const { code, stdout } = run(
      JSON.stringify({
        preset: 'pospischil-rs-2008',
        potencies: { gNa: { ic50: 1, hill: 1 } },
        concentrations: [1],
        uncertainty: {
          seed: 1,
          draws: 10,
          potencies: {
            gNa: {
              covariance: [
                [0, 0],
                [0, 0],
              ],
            },
          },
        },
      }),
    );
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    expect(out.caution).toMatch(/not a clinical or regulatory safety determination/);
    const c = out.conditions[0].tonic;
    expect(c.rheobase_uA_cm2).not.toBeNull();
    expect(c.bands.rheobase_uA_cm2).toEqual({
      median: c.rheobase_uA_cm2,
      low: c.rheobase_uA_cm2,
      high: c.rheobase_uA_cm2,
      missing: 0,
    });
    // Without inactivatedIc50 the state-dependent side is the tonic one.
    expect(out.conditions[0].stateDependent).toEqual(c);
  });

  // State-dependent block (Kr = ic50, Ki = inactivatedIc50) gets bands of its own: its drawn Kr moves the
  // block while the shift of inactivation stays the estimate's. Zero covariance still collapses each band.
  test('state-dependent potencies: each side has its bands and firing transition', () => {
    const { code, stdout, stderr } = run(
      JSON.stringify({
        // Pospischil's cell fires repetitively at twice its rheobase (HH 1952 does not), so it has a transition.
        preset: 'pospischil-rs-2008',
        potencies: { gNa: { ic50: 10, hill: 1, inactivatedIc50: 0.5 } },
        concentrations: [1],
        uncertainty: {
          seed: 2,
          draws: 10,
          potencies: {
            gNa: {
              covariance: [
                [0, 0],
                [0, 0],
              ],
            },
          },
        },
      }),
    );
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    const { tonic, stateDependent } = out.conditions[0];
    for (const side of [tonic, stateDependent]) {
      expect(side.bands.rheobase_uA_cm2.median).toBe(side.rheobase_uA_cm2);
      expect(side.bands.rheobase_uA_cm2.low).toBe(side.rheobase_uA_cm2);
      expect(side.bands.rheobase_uA_cm2.high).toBe(side.rheobase_uA_cm2);
    }
    // The shift makes the cell harder to excite than tonic block alone (as in the test above).
    expect(stateDependent.bands.rheobase_uA_cm2.median).toBeGreaterThan(tonic.bands.rheobase_uA_cm2.median);
    expect(stateDependent.bands.referenceRate_Hz.median).toBe(stateDependent.referenceRate_Hz);
    expect(Object.keys(out.firingTransition)).toEqual(['tonic', 'stateDependent']);
    expect(out.firingTransition.stateDependent.status).toBe('found');
    // Silencing needs less drug with the shift than with tonic block alone.
    expect(out.firingTransition.stateDependent.concentration).toBeLessThan(
      out.firingTransition.tonic.concentration,
    );
  });

  test('bands without potencies are refused with a message', () => {
    const { code, stderr } = run(
      JSON.stringify({ preset: 'hh-squid-1952', block: { gNa: 0.2 }, uncertainty: { seed: 1 } }),
    );
    expect(code).toBe(1);
    expect(stderr).toContain('uncertainty bands need potencies');
  });
});
