import { z } from 'zod';
import { PRESET_NAMES, conductanceNames, getPreset } from '@/lib/science/neuron/presets';

const number = (message: string) => z.coerce.number({ error: message }).refine(Number.isFinite, message);

/** Exposures as typed in a form: numbers in µM separated by commas or spaces. */
const exposures = z.preprocess(
  (value) =>
    typeof value === 'string'
      ? value
          .split(/[\s,;]+/)
          .filter(Boolean)
          .map(Number)
      : value,
  z
    .array(
      z
        .number({ error: 'Exposures must be numbers in µM.' })
        .positive('Exposures must be above 0 µM.')
        .finite(),
    )
    .max(12, 'At most 12 exposures.'),
);

/** A screen with its QC thresholds, as an admin creates or edits it. */
export const screenSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter a name.').max(120),
    description: z.string().trim().max(2000).default(''),
    neuronPreset: z.enum(PRESET_NAMES, { error: `Choose a preset: ${PRESET_NAMES.join(', ')}.` }),
    zPrimeMin: number('Enter Z′ as a number.').pipe(z.number().max(1, 'Z′ cannot exceed 1.')),
    sealResistanceMin_GOhm: number('Enter a number of GΩ.').pipe(z.number().min(0, 'Must be 0 or more.')),
    controlCurrentMin_pA: number('Enter a number of pA.').pipe(z.number().min(0, 'Must be 0 or more.')),
    seriesResistanceMax_MOhm: number('Enter a number of MΩ.').pipe(z.number().positive('Must be above 0.')),
    capacitanceMin_pF: number('Enter a number of pF.').pipe(z.number().min(0, 'Must be 0 or more.')),
    capacitanceMax_pF: number('Enter a number of pF.').pipe(z.number().positive('Must be above 0.')),
    vehicleRundownMax_percent: number('Enter a percentage.').pipe(
      z.number().min(0, 'Must be 0 or more.').max(100, 'Cannot exceed 100 %.'),
    ),
    exposures_uM: exposures,
  })
  .refine((s) => s.capacitanceMax_pF > s.capacitanceMin_pF, {
    path: ['capacitanceMax_pF'],
    message: 'Must be above the minimum capacitance.',
  });

export type ScreenInput = z.infer<typeof screenSchema>;

/** A target of a screen, mapped to a blockable conductance of the screen's preset. */
export const targetSchema = z.object({
  name: z.string().trim().min(1, 'Enter the target name as the export writes it.').max(80),
  conductance: z.string().trim().min(1, 'Choose the model conductance.'),
  description: z.string().trim().max(500).default(''),
});

export type TargetInput = z.infer<typeof targetSchema>;

/** The conductances of a preset that a target may map to. */
export function blockableConductances(presetName: string): string[] {
  return conductanceNames(getPreset(presetName)).blockable;
}
