import type { NeuronPreset } from '../types';

/**
 * Gatewell's default mapping from a target's name to a conductance of a preset, used for the presets a
 * target has not been mapped in by hand (our own rules, no source beyond the usual channel naming:
 * Nav/SCN sodium channels, Kv7/KCNQ channels carrying the M-current, Kv1–Kv3 delayed rectifiers).
 * The first rule whose pattern matches decides (a Nav subtype rule passes on to the generic sodium rule
 * when the preset has no conductance of that subtype); it gives a conductance only if the preset has it as a
 * blockable conductance, so a target that stands for nothing in a preset (hERG in a neuron, an A-type
 * Kv4 current, a calcium channel) gets no default and must be mapped, or the preset refused.
 */
export const TARGET_CONDUCTANCE_RULES: readonly {
  family: string;
  pattern: RegExp;
  conductance: string | null;
  /** When the preset lacks this conductance, go on to the next matching rule (Nav subtypes → gNa). */
  fallThrough?: boolean;
}[] = [
  // No counterpart in the presets: hERG (Kv11, KCNH), A-type Kv4, calcium channels.
  { family: 'hERG (Kv11, KCNH)', pattern: /herg|kv\s*11|kcnh/i, conductance: null },
  { family: 'A-type potassium (Kv4, KCND)', pattern: /kv\s*4|kcnd|\bi\s*a\b|a-type/i, conductance: null },
  { family: 'calcium (Cav, CACNA)', pattern: /ca\s*v\s*\d|\bcav\b|cacna|calcium/i, conductance: null },
  // Subtype-specific sodium conductances (the DRG preset); a preset without them falls to no default.
  {
    family: 'Nav1.7 sodium (SCN9A)',
    pattern: /na\s*v\s*1\.7|scn9a/i,
    conductance: 'gNav17',
    fallThrough: true,
  },
  {
    family: 'Nav1.8 sodium (SCN10A)',
    pattern: /na\s*v\s*1\.8|scn10a/i,
    conductance: 'gNav18',
    fallThrough: true,
  },
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
  for (const rule of TARGET_CONDUCTANCE_RULES) {
    if (!rule.pattern.test(targetName)) continue;
    const c = rule.conductance ? preset.conductances.find((x) => x.name === rule.conductance) : undefined;
    if (c?.blockable) return c.name;
    if (!rule.fallThrough) return null;
  }
  return null;
}
