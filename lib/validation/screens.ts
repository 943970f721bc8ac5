import { BLOCK_READOUT_LABEL, type TargetReadoutNames } from '@/lib/domain/fits';
import { z } from 'zod';
import { PRESET_NAMES, conductanceNames, getPreset, isPresetName } from '@/lib/science/neuron/presets';
import { defaultConductance } from '@/lib/science/neuron/presets/target-conductance';

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
  /**
   * The names of the target's block readouts: blank keeps one readout; naming the use-dependent one (the
   * n-th pulse of a train, a depolarised holding potential) makes the target report two, tonic and
   * use-dependent, each fitted on its own.
   */
  tonicReadoutName: z.string().trim().max(40).default(''),
  useDependentReadoutName: z.string().trim().max(40).default(''),
});

type TargetFields = z.infer<typeof targetSchema>;
/** A target as services take it: the readout names may be left out (one readout). */
export type TargetInput = Omit<TargetFields, 'tonicReadoutName' | 'useDependentReadoutName'> &
  Partial<Pick<TargetFields, 'tonicReadoutName' | 'useDependentReadoutName'>>;

/** A target's conductance in one preset other than its screen's current one, as an admin sets it. */
export const targetMappingSchema = z.object({
  preset: z.enum(PRESET_NAMES, { error: `Choose a preset: ${PRESET_NAMES.join(', ')}.` }),
  conductance: z.string().trim().min(1, 'Choose the model conductance.'),
});

/** The stored names of a target's readouts (targets.block_readouts) from the form's two names. */
export function targetReadoutNames(input: {
  tonicReadoutName?: string | undefined;
  useDependentReadoutName?: string | undefined;
}): TargetReadoutNames {
  if (!input.useDependentReadoutName) return {};
  return {
    tonic: input.tonicReadoutName || BLOCK_READOUT_LABEL.tonic,
    use_dependent: input.useDependentReadoutName,
  };
}

export type TargetMappingInput = z.infer<typeof targetMappingSchema>;

/** The conductances of a preset that a target may map to. */
export function blockableConductances(presetName: string): string[] {
  return conductanceNames(getPreset(presetName)).blockable;
}

/**
 * A target's conductance per preset (preset name → conductance), as stored in
 * targets.conductance_by_preset: every key a known preset, every value a blockable conductance of it.
 */
export const conductanceByPresetSchema = z
  .record(z.string(), z.string(), { error: 'The mapping must be an object of preset → conductance.' })
  .superRefine((mapping, ctx) => {
    for (const [preset, conductance] of Object.entries(mapping)) {
      if (!isPresetName(preset)) {
        ctx.addIssue({ code: 'custom', path: [preset], message: `Unknown preset ${preset}.` });
      } else if (!blockableConductances(preset).includes(conductance)) {
        ctx.addIssue({
          code: 'custom',
          path: [preset],
          message: `${preset} has no blockable conductance ${conductance}; choose one of ${blockableConductances(preset).join(', ')}.`,
        });
      }
    }
  });

export type ConductanceByPreset = z.infer<typeof conductanceByPresetSchema>;

/**
 * A target's conductance in `presetName`: the one stored for that preset if it is still blockable there,
 * else Gatewell's default for the target's name (lib/science/neuron/presets/target-conductance.ts), else null.
 */
export function conductanceInPreset(
  target: { name: string; conductanceByPreset: Record<string, string> },
  presetName: string,
): string | null {
  const stored = target.conductanceByPreset[presetName];
  if (stored !== undefined && blockableConductances(presetName).includes(stored)) return stored;
  return defaultConductance(target.name, getPreset(presetName));
}

/** A new target's mapping in every preset: the chosen conductance in the screen's preset, defaults elsewhere. */
export function initialConductanceByPreset(
  targetName: string,
  screenPreset: string,
  conductance: string,
): ConductanceByPreset {
  const mapping: ConductanceByPreset = {};
  for (const preset of PRESET_NAMES) {
    const c = preset === screenPreset ? conductance : defaultConductance(targetName, getPreset(preset));
    if (c) mapping[preset] = c;
  }
  return conductanceByPresetSchema.parse(mapping);
}
