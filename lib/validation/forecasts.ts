import { z } from 'zod';

/** How a target's fit enters a forecast: its potency is used, or why it is treated as no block. */
export const POTENCY_USES = [
  'used',
  'above_range',
  'inactive',
  'insufficient',
  'not_converged',
  'slope_out_of_range',
  'not_tested',
  'not_modelled',
] as const;
export type PotencyUse = (typeof POTENCY_USES)[number];

/**
 * A target's use-dependent fit as the state-dependent forecast reads it: its IC50 taken as Ki (the
 * inactivated-state affinity, modulated receptor) where the tonic potency is used and the conductance has
 * an inactivation gate; inactivatedIc50_uM null where the state-dependent case takes tonic block only.
 */
export const stateDependenceSchema = z.object({
  fitId: z.uuid(),
  readoutName: z.string().nullable(),
  ic50_uM: z.number().nullable(),
  hill: z.number().nullable(),
  inactivatedIc50_uM: z.number().nullable(),
  note: z.string(),
});

/** One target of a compound as a forecast sees it (the note says in words what was done). */
export const targetPotencySchema = z.object({
  targetId: z.uuid(),
  target: z.string(),
  /** The fit behind the potency (its covariance or wells give the forecast's band); null when untested. */
  fitId: z.uuid().nullable(),
  conductance: z.string(),
  use: z.enum(POTENCY_USES),
  ic50_uM: z.number().nullable(),
  hill: z.number().nullable(),
  ic50LowerBound_uM: z.number().nullable(),
  note: z.string(),
  /** Fraction of the conductance blocked at each exposure of the screen (0 where no potency is used). */
  blockAtExposures: z.array(z.number()),
  /** The plate the potency came from (compound profiles draw from several plates). */
  plate: z.object({ id: z.uuid(), label: z.string(), state: z.string() }).nullable(),
  /** The target's use-dependent fit and how the state-dependent forecast takes it; null: no such fit. */
  stateDependence: stateDependenceSchema.nullable(),
});

const nullableNumber = z.number().nullable();
const shiftSchema = z.object({
  control: nullableNumber,
  value: nullableNumber,
  delta: nullableNumber,
  relative: nullableNumber,
});

/** Median and 2.5–97.5 % quantiles of a measure over the draws (null: undefined there; `missing` draws had no value). */
export const bandSchema = z.object({
  median: nullableNumber,
  low: nullableNumber,
  high: nullableNumber,
  missing: z.number(),
});

export const conditionBandSchema = z.object({
  block: z.record(z.string(), bandSchema),
  rheobase_uA_cm2: bandSchema,
  threshold_mV: bandSchema,
  referenceRate_Hz: bandSchema,
  /** Within the firing transition's band, or the rate changes by more than half within its band. */
  nearTransition: z.boolean(),
});

/** Where the compound stops the cell firing repetitively at the reference drive (firing-transition.ts). */
export const transitionViewSchema = z.object({
  status: z.enum(['found', 'silent-at-control', 'fires-throughout']),
  concentration_uM: nullableNumber,
  block: z.record(z.string(), z.number()).nullable(),
  band: z.object({ low: z.number(), median: z.number(), high: z.number() }).nullable(),
  note: z.string(),
});

export const conditionViewSchema = z.object({
  concentration_uM: z.number(),
  /** One of the screen's exposures of interest (the others belong to the concentration sweep). */
  exposure: z.boolean(),
  block: z.record(z.string(), z.number()),
  measures: z.object({
    rest_mV: nullableNumber,
    rheobase_uA_cm2: nullableNumber,
    threshold_mV: nullableNumber,
    referenceRate_Hz: nullableNumber,
    fI: z.array(z.object({ drive_uA_cm2: z.number(), rate_Hz: z.number() })),
    flags: z.array(z.string()),
  }),
  shifts: z.object({
    rest_mV: shiftSchema,
    rheobase_uA_cm2: shiftSchema,
    threshold_mV: shiftSchema,
    referenceRate_Hz: shiftSchema,
  }),
  /** The 95 % band of each measure from the fits' uncertainty; null for control and for forecasts stored without bands. */
  band: conditionBandSchema.nullable(),
});

const traceSchema = z.object({ t_ms: z.array(z.number()), v_mV: z.array(z.number()) });

/** A computed forecast as pages receive it (the stored result keeps every detail). */
export const forecastViewSchema = z.object({
  inputSha256: z.string().length(64),
  computedAt: z.string(),
  reused: z.boolean(),
  preset: z.object({ name: z.string(), title: z.string(), reference: z.string() }),
  protocol: z.object({
    rheobaseStep_ms: z.number(),
    rateStep_ms: z.number(),
    thresholdSlope_mV_ms: z.number(),
    referenceDriveFactor: z.number(),
  }),
  referenceDrive_uA_cm2: nullableNumber,
  control: conditionViewSchema,
  conditions: z.array(conditionViewSchema),
  /** How the bands were made (draws, seed, the source of each potency's draws), or null without bands. */
  bands: z
    .object({
      draws: z.number(),
      seed: z.number(),
      method: z.string(),
      sources: z.array(z.object({ conductance: z.string(), source: z.string(), note: z.string() })),
      /** Null for forecasts stored before transitions were found. */
      transition: transitionViewSchema.nullable(),
    })
    .nullable(),
  traces: z
    .object({
      drive_uA_cm2: z.number(),
      concentration_uM: nullableNumber,
      control: traceSchema,
      condition: traceSchema.nullable(),
    })
    .nullable(),
  caution: z.string(),
});

/** A compound's forecast on one plate (or in its profile): potencies, and the forecast or why there is none. */
export const compoundForecastSchema = z.object({
  compoundId: z.uuid(),
  compound: z.string(),
  /** The screen whose preset and exposures the forecast uses. */
  screen: z.object({ id: z.uuid(), name: z.string() }),
  preset: z.string(),
  exposures_uM: z.array(z.number()),
  targets: z.array(targetPotencySchema),
  /** Why no forecast is computed (no usable potency, no exposures); null when one is. */
  reason: z.string().nullable(),
  forecast: forecastViewSchema.nullable(),
  /**
   * The same forecast with state-dependent block (modulated receptor: Kr the tonic IC50, Ki the
   * use-dependent IC50), beside the tonic-only one; null when no used potency has a Ki.
   */
  stateDependent: forecastViewSchema.nullable(),
  caution: z.string(),
});

/** The plate's forecast tab before any computation: each compound's potencies and whether it can be forecast. */
export const plateForecastListSchema = z.object({
  plate: z.object({ id: z.uuid(), label: z.string(), state: z.string() }),
  preset: z.string(),
  exposures_uM: z.array(z.number()),
  compounds: z.array(
    z.object({
      compoundId: z.uuid(),
      compound: z.string(),
      targets: z.array(targetPotencySchema),
      reason: z.string().nullable(),
      stored: z.boolean(),
    }),
  ),
  caution: z.string(),
});

const AT_MESSAGE = 'at must be the index of one of the screen’s exposures.';

/** Query of the plate forecast route: no compound lists them; a compound computes (or reuses) its forecast. */
export const plateForecastQuerySchema = z.object({
  compoundId: z.uuid({ error: 'compoundId must be the id of a compound on this plate.' }).optional(),
  at: z.preprocess(
    (v) => (v === '' ? undefined : v),
    z.coerce
      .number({ error: AT_MESSAGE })
      .int({ error: AT_MESSAGE })
      .min(0, { error: AT_MESSAGE })
      .optional(),
  ),
});

export type TargetPotency = z.infer<typeof targetPotencySchema>;
export type StateDependence = z.infer<typeof stateDependenceSchema>;
export type ConditionView = z.infer<typeof conditionViewSchema>;
export type BandView = z.infer<typeof bandSchema>;
export type ForecastView = z.infer<typeof forecastViewSchema>;
export type CompoundForecast = z.infer<typeof compoundForecastSchema>;
export type PlateForecastList = z.infer<typeof plateForecastListSchema>;

/** Query of the compound forecast route: the screen whose preset and exposures to use, and the trace exposure. */
export const compoundForecastQuerySchema = z.object({
  screenId: z.uuid({ error: 'screenId must be the id of a screen the compound was tested in.' }).optional(),
  at: plateForecastQuerySchema.shape.at,
});

export type TransitionView = z.infer<typeof transitionViewSchema>;
