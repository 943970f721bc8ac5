// Each built-in preset's file writes out its model equations and gives the source of every parameter
// beside it (issue 20 point 4; the convention of lib/science: every published constant with its reference).
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, test } from 'vitest';
import { PRESET_NAMES, getPreset } from '@/lib/science/neuron/presets';

const folder = resolve(__dirname, '../../lib/science/neuron/presets');
const PARAMETER_KEYS = [
  'capacitance_uF_cm2',
  'temperature_C',
  'holdingCurrent_uA_cm2',
  'g_mS_cm2',
  'reversal_mV',
  'q10',
  'referenceTemperature_C',
  'rateFactor',
];

describe.each(PRESET_NAMES)('preset file %s.ts', (name) => {
  const text = readFileSync(join(folder, `${name}.ts`), 'utf8');
  const lines = text.split('\n');

  test('is the file of the preset of that name, and cites its paper', () => {
    const preset = getPreset(name);
    expect(text).toContain(`name: '${name}'`);
    expect(preset.reference.length).toBeGreaterThan(20);
  });

  test('writes out the membrane equation and every gate’s rate functions', () => {
    expect(text).toMatch(/C dV\/dt = /);
    for (const gate of getPreset(name).conductances.flatMap((c) => c.gates)) {
      // α/β or ∞/τ of each gate, as a formula in the file's comments.
      expect(text).toMatch(new RegExp(`(α${gate.name}|β${gate.name}|${gate.name}∞|τ${gate.name})\\s*=`));
    }
  });

  test('gives a source beside every parameter (a comment on its line or the line above)', () => {
    const bare = lines
      .map((line, i) => ({ line, i }))
      .filter(({ line }) => PARAMETER_KEYS.some((key) => new RegExp(`^\\s*${key}:`).test(line)))
      .filter(({ line, i }) => !line.includes('//') && !/^\s*\/\//.test(lines[i - 1] ?? ''))
      .map(({ line, i }) => `${i + 1}: ${line.trim()}`);
    expect(bare).toEqual([]);
  });
});
