import { PRESET_NAMES, getPreset } from '@/lib/science/neuron/presets';

/** The neuron presets as select options, titled by their source. */
export const PRESET_OPTIONS = PRESET_NAMES.map((name) => ({
  value: name,
  label: `${name} — ${getPreset(name).title}`,
}));
