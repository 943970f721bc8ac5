// Gatewell's default target → conductance mapping per preset, and the zod check of a stored mapping.
// The rules are our own (no source beyond the usual channel names); these tests pin what they decide.
import { describe, expect, test } from 'vitest';
import { getPreset } from '@/lib/science/neuron/presets';
import { defaultConductance } from '@/lib/science/neuron/presets/target-conductance';
import { conductanceByPresetSchema, initialConductanceByPreset } from '@/lib/validation/screens';

describe('default conductance of a target name', () => {
  test.each([
    ['Nav1.7', 'hh-squid-1952', 'gNa'],
    ['hNav1.5', 'wang-buzsaki-1996', 'gNa'],
    ['SCN9A', 'pospischil-rs-2008', 'gNa'],
    ['Kv7.2/7.3', 'pospischil-rs-2008', 'gM'],
    ['KCNQ2', 'pospischil-rs-2008', 'gM'],
    ['Kv7.2/7.3', 'hh-squid-1952', null],
    ['Kv2.1', 'wang-buzsaki-1996', 'gK'],
    ['Kv3.1', 'hh-squid-1952', 'gK'],
    ['Kv1.3', 'pospischil-rs-2008', 'gK'],
    ['hERG', 'hh-squid-1952', null],
    ['Kv11.1', 'hh-squid-1952', null],
    ['Kv4.3', 'pospischil-rs-2008', null],
    ['Cav1.2', 'pospischil-rs-2008', null],
    ['Leak', 'hh-squid-1952', null],
    // The DRG preset's subtype conductances; a subtype rule falls back to gNa in the other presets (above).
    ['Nav1.7', 'xie-drg-2024', 'gNav17'],
    ['hSCN9A', 'xie-drg-2024', 'gNav17'],
    ['Nav1.8', 'xie-drg-2024', 'gNav18'],
    ['SCN10A', 'xie-drg-2024', 'gNav18'],
    ['Nav1.8', 'wang-buzsaki-1996', 'gNa'],
    ['hNav1.5', 'xie-drg-2024', null],
    ['Kv7.2/7.3', 'xie-drg-2024', 'gM'],
    ['Kv2.1', 'xie-drg-2024', 'gK'],
  ])('%s in %s → %s', (name, preset, expected) => {
    expect(defaultConductance(name, getPreset(preset))).toBe(expected);
  });
});

describe('stored mapping (conductanceByPresetSchema)', () => {
  test('accepts known presets with blockable conductances', () => {
    expect(conductanceByPresetSchema.parse({ 'hh-squid-1952': 'gK', 'pospischil-rs-2008': 'gM' })).toEqual({
      'hh-squid-1952': 'gK',
      'pospischil-rs-2008': 'gM',
    });
  });

  test('names an unknown preset, a missing conductance and the leak', () => {
    const result = conductanceByPresetSchema.safeParse({
      'frog-heart': 'gNa',
      'wang-buzsaki-1996': 'gM',
      'hh-squid-1952': 'gL',
    });
    expect(result.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['frog-heart', 'Unknown preset frog-heart.'],
      ['wang-buzsaki-1996', 'wang-buzsaki-1996 has no blockable conductance gM; choose one of gNa, gK.'],
      ['hh-squid-1952', 'hh-squid-1952 has no blockable conductance gL; choose one of gNa, gK.'],
    ]);
  });

  test('a new target: the chosen conductance in its screen’s preset, defaults elsewhere, none where none', () => {
    expect(initialConductanceByPreset('Kv7.2', 'pospischil-rs-2008', 'gM')).toEqual({
      'pospischil-rs-2008': 'gM',
      'xie-drg-2024': 'gM',
    });
    expect(initialConductanceByPreset('Nav1.7', 'wang-buzsaki-1996', 'gNa')).toEqual({
      'hh-squid-1952': 'gNa',
      'pospischil-rs-2008': 'gNa',
      'wang-buzsaki-1996': 'gNa',
      'xie-drg-2024': 'gNav17',
    });
  });
});
