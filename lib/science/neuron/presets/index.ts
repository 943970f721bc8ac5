import type { NeuronPreset } from '../types';
import { hhSquid1952 } from './hh-squid-1952';
import { pospischilRs2008 } from './pospischil-rs-2008';
import { wangBuzsaki1996 } from './wang-buzsaki-1996';
import { xieDrg2024 } from './xie-drg-2024';

/** Names of the built-in neuron presets. */
export const PRESET_NAMES = [
  'hh-squid-1952',
  'pospischil-rs-2008',
  'wang-buzsaki-1996',
  'xie-drg-2024',
] as const;
export type PresetName = (typeof PRESET_NAMES)[number];

const PRESETS: Record<PresetName, NeuronPreset> = {
  'hh-squid-1952': hhSquid1952,
  'pospischil-rs-2008': pospischilRs2008,
  'wang-buzsaki-1996': wangBuzsaki1996,
  'xie-drg-2024': xieDrg2024,
};

export function isPresetName(name: string): name is PresetName {
  return (PRESET_NAMES as readonly string[]).includes(name);
}

/** The built-in preset of that name; throws on an unknown name. */
export function getPreset(name: string): NeuronPreset {
  if (!isPresetName(name))
    throw new Error(`unknown neuron preset "${name}" (known: ${PRESET_NAMES.join(', ')})`);
  return PRESETS[name];
}

/** Conductance names of a preset, and which of them a compound may block. */
export function conductanceNames(preset: NeuronPreset): { all: string[]; blockable: string[] } {
  return {
    all: preset.conductances.map((c) => c.name),
    blockable: preset.conductances.filter((c) => c.blockable).map((c) => c.name),
  };
}

export { hhSquid1952, pospischilRs2008, wangBuzsaki1996, xieDrg2024 };
