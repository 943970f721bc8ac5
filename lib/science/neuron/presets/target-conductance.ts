import type { NeuronPreset } from '../types';

/**
 * Gatewell's default mapping from a target's name to a conductance of a preset, used for the presets a
 * target has not been mapped in by hand (our own rules, no source beyond the usual channel naming:
 * Nav/SCN sodium channels, Kv7/KCNQ channels carrying the M-current, Kv1–Kv3 delayed rectifiers).
 * The first rule whose pattern matches decides; it gives a conductance only if the preset has it as a
 * blockable conductance, so a target that stands for nothing in a preset (hERG in a neuron, an A-type
 * Kv4 current, a calcium channel) gets no default and must be mapped, or the preset refused.
 */
export const TARGET_CONDUCTANCE_RULES: readonly {
  family: string;
  pattern: RegExp;
  conductance: string | null;
}[] = [
  // No counterpart in the presets: hERG (Kv11, KCNH), A-type Kv4, calcium channels.
  { family: 'hERG (Kv11, KCNH)', pattern: /herg|kv\s*11|kcnh/i, conductance: null },
  { family: 'A-type potassium (Kv4, KCND)', pattern: /kv\s*4|kcnd|\bi\s*a\b|a-type/i, conductance: null },
  { family: 'calcium (Cav, CACNA)', pattern: /ca\s*v\s*\d|\bcav\b|cacna|calcium/i, conductance: null },
  { family: 'M-type potassium (Kv7, KCNQ)', pattern: /kv\s*7|kcnq|m-current|\bi\s*m\b/i, conductance: 'gM' },
  { family: 'sodium (Nav, SCN)', pattern: /na\s*v|scn\d*a|sodium|\bi\s*na\b/i, conductance: 'gNa' },
  {
    family: 'delayed-rectifier potassium (Kv1–Kv3, Kdr)',
    pattern: /kv\s*[123]\b|kv\s*[123]\.|\bkv\b|kcn[abc]|kdr|delayed|\bi\s*k\b/i,
    conductance: 'gK',
  },
];

/** The default conductance of `preset` for a target named `targetName`, or null when there is none. */
export function defaultConductance(targetName: string, preset: NeuronPreset): string | null {
  const rule = TARGET_CONDUCTANCE_RULES.find((r) => r.pattern.test(targetName));
  if (!rule?.conductance) return null;
  const c = preset.conductances.find((x) => x.name === rule.conductance);
  return c?.blockable ? c.name : null;
}
