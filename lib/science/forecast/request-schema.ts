import { z } from 'zod';
import { PRESET_NAMES, conductanceNames, getPreset, isPresetName } from '../neuron/presets';
import { stateDependentConductances } from '../neuron/state-dependent-block';

/** Optional protocol settings of a forecast; defaults in DEFAULT_FORECAST_PROTOCOL. */
export const forecastProtocolSchema = z.strictObject({
  stepMs: z
    .number({ error: 'stepMs must be a number (ms)' })
    .min(10, { error: 'stepMs must be at least 10 ms' })
    .max(10_000, { error: 'stepMs must be at most 10000 ms' })
    .optional(),
  rateStepMs: z
    .number({ error: 'rateStepMs must be a number (ms)' })
    .min(100, { error: 'rateStepMs must be at least 100 ms' })
    .max(20_000, { error: 'rateStepMs must be at most 20000 ms' })
    .optional(),
  dt_ms: z
    .number({ error: 'dt_ms must be a number (ms)' })
    .min(0.001, { error: 'dt_ms must be at least 0.001 ms' })
    .max(0.1, { error: 'dt_ms must be at most 0.1 ms' })
    .optional(),
  thresholdSlope_mV_ms: z
    .number({ error: 'thresholdSlope_mV_ms must be a number' })
    .positive({ error: 'thresholdSlope_mV_ms must be positive' })
    .max(1000)
    .optional(),
  thresholdStepFactor: z
    .number({ error: 'thresholdStepFactor must be a number' })
    .min(1, { error: 'thresholdStepFactor must be at least 1' })
    .max(10)
    .optional(),
  rheobaseRelTolerance: z
    .number({ error: 'rheobaseRelTolerance must be a number' })
    .min(1e-6)
    .max(0.1)
    .optional(),
  rheobaseCeiling_uA_cm2: z
    .number({ error: 'rheobaseCeiling_uA_cm2 must be a number' })
    .positive()
    .max(10_000)
    .optional(),
  referenceDriveFactor: z
    .number({ error: 'referenceDriveFactor must be a number' })
    .positive({ error: 'referenceDriveFactor must be positive' })
    .max(100)
    .optional(),
  drives_uA_cm2: z
    .array(
      z
        .number({ error: 'each drive must be a number (µA/cm²)' })
        .min(-1000, { error: 'drives must be within ±1000 µA/cm²' })
        .max(1000, { error: 'drives must be within ±1000 µA/cm²' }),
      { error: 'drives_uA_cm2 must be a list of numbers' },
    )
    .max(100, { error: 'at most 100 drives' })
    .optional(),
  fiCurve: z
    .strictObject({
      points: z
        .int({ error: 'fiCurve.points must be a whole number' })
        .min(1, { error: 'fiCurve.points must be 1–50' })
        .max(50, { error: 'fiCurve.points must be 1–50' }),
      upToFactor: z
        .number({ error: 'fiCurve.upToFactor must be a number' })
        .positive({ error: 'fiCurve.upToFactor must be positive' })
        .max(100),
    })
    .optional(),
});

const fraction = z
  .number({ error: 'block fraction must be a number' })
  .min(0, { error: 'block fraction must be between 0 and 1' })
  .max(1, { error: 'block fraction must be between 0 and 1' });

export const potencySchema = z.strictObject({
  /** Tonic IC50: the resting-state affinity Kr when inactivatedIc50 is given. */
  ic50: z.number({ error: 'ic50 must be a number' }).positive({ error: 'ic50 must be positive' }),
  hill: z
    .number({ error: 'hill must be a number' })
    .positive({ error: 'Hill slope must be positive' })
    .max(10, { error: 'Hill slope must be at most 10' }),
  /**
   * Inactivated-state IC50 (Ki, same unit as ic50): makes the block state-dependent (modulated
   * receptor, lib/science/neuron/state-dependent-block.ts). Only for a conductance with an
   * inactivation gate.
   */
  inactivatedIc50: z
    .number({ error: 'inactivatedIc50 must be a number' })
    .positive({ error: 'inactivatedIc50 must be positive' })
    .optional(),
});

const finite = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, {
    error: `${what} must be finite`,
  });

/** What is known of one fit's uncertainty: its covariance of (log10 IC50, Hill slope) and/or its wells. */
const potencyUncertaintySchema = z.strictObject({
  covariance: z
    .array(z.array(finite('covariance entries')).length(2, { error: 'covariance must be 2 × 2' }), {
      error: 'covariance must be a 2 × 2 array of numbers',
    })
    .length(2, { error: 'covariance must be 2 × 2' })
    .nullable()
    .optional(),
  degreesOfFreedom: z
    .int({ error: 'degreesOfFreedom must be a whole number' })
    .min(1, { error: 'degreesOfFreedom must be at least 1' })
    .nullable()
    .optional(),
  wells: z
    .array(
      z.strictObject({
        concentration_uM: finite('well concentration_uM').min(0, {
          error: 'well concentrations must be ≥ 0',
        }),
        block: finite('well block'),
      }),
    )
    .max(2000, { error: 'at most 2000 wells per fit' })
    .optional(),
  model: z.enum(['hill2', 'hill4']).optional(),
});

/** Uncertainty bands: draws, seed, and what each potency's uncertainty is. */
const uncertaintySchema = z.strictObject({
  draws: z
    .int({ error: 'uncertainty.draws must be a whole number' })
    .min(10, { error: 'uncertainty.draws must be 10–5000' })
    .max(5000, { error: 'uncertainty.draws must be 10–5000' })
    .optional(),
  seed: z
    .int({ error: 'uncertainty.seed must be a whole number' })
    .min(0, { error: 'uncertainty.seed must be 0 – 4294967295' })
    .max(4294967295, { error: 'uncertainty.seed must be 0 – 4294967295' }),
  potencies: z.record(z.string(), potencyUncertaintySchema).optional(),
  /** Band only these of the request's concentrations. @default every one */
  concentrations: z
    .array(z.number({ error: 'uncertainty.concentrations must be numbers' }).min(0))
    .max(50)
    .optional(),
});

const traceSchema = z.union([
  z.literal(false),
  z.strictObject({
    /** Index into the blocked conditions. @default the last one */
    condition: z.int({ error: 'trace.condition must be a whole number' }).min(0).optional(),
    /** @default the reference drive */
    drive_uA_cm2: z.number().min(-1000).max(1000).optional(),
    duration_ms: z.number().min(10).max(20_000).optional(),
    points: z.int().min(10).max(20_000).optional(),
  }),
]);

/** Check that every key names a blockable conductance of the preset. */
function checkConductanceKeys(preset: string, keys: string[], field: string, ctx: z.RefinementCtx): void {
  const { all, blockable } = conductanceNames(getPreset(preset));
  for (const key of keys) {
    if (!all.includes(key)) {
      ctx.addIssue({
        code: 'custom',
        path: [field, key],
        message: `unknown conductance "${key}" for preset ${preset} (blockable: ${blockable.join(', ')})`,
      });
    } else if (!blockable.includes(key)) {
      ctx.addIssue({
        code: 'custom',
        path: [field, key],
        message: `conductance "${key}" of preset ${preset} cannot be blocked (blockable: ${blockable.join(', ')})`,
      });
    }
  }
}

/** inactivatedIc50 only on conductances whose inactivation gate state-dependent block can shift. */
function checkStateDependentKeys(
  preset: string,
  potencies: Record<string, unknown>,
  ctx: z.RefinementCtx,
): void {
  const shiftable = stateDependentConductances(getPreset(preset));
  for (const [key, potency] of Object.entries(potencies)) {
    if (!isObject(potency) || potency.inactivatedIc50 === undefined || shiftable.includes(key)) continue;
    ctx.addIssue({
      code: 'custom',
      path: ['potencies', key, 'inactivatedIc50'],
      message: `conductance "${key}" of preset ${preset} has no inactivation gate, so no state-dependent block (possible: ${shiftable.join(', ') || 'none'})`,
    });
  }
}

/**
 * A forecast request: a preset and either one block map (conductance → fraction 0–1) or potencies
 * (IC50 and Hill slope per conductance, and optionally the inactivated-state IC50 for state-dependent
 * block) with concentrations (same unit as the IC50s).
 */
export const forecastRequestSchema = z
  .strictObject(
    {
      preset: z.enum(PRESET_NAMES, { error: `preset must be one of: ${PRESET_NAMES.join(', ')}` }),
      block: z
        .record(z.string(), fraction, { error: 'block must be an object of conductance → fraction' })
        .optional(),
      potencies: z
        .record(z.string(), potencySchema, {
          error: 'potencies must be an object of conductance → {ic50, hill}',
        })
        .optional(),
      concentrations: z
        .array(
          z
            .number({ error: 'each concentration must be a number' })
            .min(0, { error: 'concentrations must be ≥ 0' }),
          { error: 'concentrations must be a list of numbers' },
        )
        .min(1, { error: 'give at least one concentration' })
        .max(50, { error: 'at most 50 concentrations' })
        .optional(),
      concentrationUnit: z.string().max(20).optional(),
      protocol: forecastProtocolSchema.optional(),
      trace: traceSchema.optional(),
      /** Uncertainty bands of every measure (needs potencies). */
      uncertainty: uncertaintySchema.optional(),
    },
    {
      error: (issue) =>
        issue.code === 'invalid_type' ? 'the forecast request must be an object' : undefined,
    },
  )
  .superRefine(
    (r, ctx) => {
      checkBlockOrPotencies(r, ctx);
      const count = r.potencies
        ? Array.isArray(r.concentrations)
          ? r.concentrations.length
          : 0
        : r.block
          ? 1
          : 0;
      if (r.trace && typeof r.trace.condition === 'number' && r.trace.condition >= count) {
        ctx.addIssue({
          code: 'custom',
          path: ['trace', 'condition'],
          message: `trace.condition must be below the number of blocked conditions (${count})`,
        });
      }
    },
    // Run even when other fields failed, so that every fault is reported at once.
    { when: (payload) => isObject(payload.value) },
  );

/**
 * What the request and the input file share: conductance keys known to the preset (and state-dependent
 * potencies only where it has an inactivation gate), either block or potencies, and potencies with their
 * concentrations.
 */
function checkBlockOrPotencies(
  r: {
    preset: string;
    block?: unknown;
    potencies?: unknown;
    concentrations?: unknown;
    uncertainty?: unknown;
  },
  ctx: z.RefinementCtx,
): void {
  if (!isPresetName(r.preset)) return;
  if (isObject(r.block)) checkConductanceKeys(r.preset, Object.keys(r.block), 'block', ctx);
  if (isObject(r.potencies)) {
    checkConductanceKeys(r.preset, Object.keys(r.potencies), 'potencies', ctx);
    checkStateDependentKeys(r.preset, r.potencies, ctx);
  }
  if (r.block && r.potencies)
    ctx.addIssue({
      code: 'custom',
      path: ['potencies'],
      message: 'give either block or potencies, not both',
    });
  if (r.potencies && !r.concentrations)
    ctx.addIssue({
      code: 'custom',
      path: ['concentrations'],
      message: 'potencies need a list of concentrations',
    });
  if (r.concentrations && !r.potencies)
    ctx.addIssue({ code: 'custom', path: ['potencies'], message: 'concentrations need potencies' });
  if (r.uncertainty && !r.potencies)
    ctx.addIssue({ code: 'custom', path: ['uncertainty'], message: 'uncertainty bands need potencies' });
  const bandPotencies = isObject(r.uncertainty) ? r.uncertainty.potencies : undefined;
  if (isObject(bandPotencies) && isObject(r.potencies)) {
    for (const key of Object.keys(bandPotencies)) {
      if (!(key in r.potencies))
        ctx.addIssue({
          code: 'custom',
          path: ['uncertainty', 'potencies', key],
          message: `uncertainty given for "${key}", which has no potency`,
        });
    }
  }
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

export type ForecastRequest = z.input<typeof forecastRequestSchema>;

/**
 * The forecast input file read by scripts/forecast.ts: one block condition,
 * {"preset":"hh-squid-1952","block":{"gNa":0.3},"stepMs":500,"drives_uA_cm2":[10,20]}, or potencies at
 * concentrations, forecast tonic and state-dependent side by side,
 * {"preset":"hh-squid-1952","potencies":{"gNa":{"ic50":10,"hill":1,"inactivatedIc50":0.5}},"concentrations":[1,3]}.
 * With potencies, optional bands: "uncertainty":{"seed":1,"draws":200,"potencies":{"gNa":{"covariance":…}}}.
 */
export const forecastInputFileSchema = z
  .strictObject(
    {
      preset: z.enum(PRESET_NAMES, { error: `preset must be one of: ${PRESET_NAMES.join(', ')}` }),
      block: z
        .record(z.string(), fraction, { error: 'block must be an object of conductance → fraction' })
        .optional(),
      potencies: forecastRequestSchema.shape.potencies,
      concentrations: forecastRequestSchema.shape.concentrations,
      stepMs: forecastProtocolSchema.shape.stepMs,
      drives_uA_cm2: forecastProtocolSchema.shape.drives_uA_cm2,
      /** With potencies: optional uncertainty bands. */
      uncertainty: uncertaintySchema.optional(),
    },
    { error: (issue) => (issue.code === 'invalid_type' ? 'the input must be a JSON object' : undefined) },
  )
  .superRefine(
    (r, ctx) => {
      checkBlockOrPotencies(r, ctx);
    },
    { when: (payload) => isObject(payload.value) },
  );

export type ForecastInputFile = z.output<typeof forecastInputFileSchema>;
export type ParsedForecastRequest = z.output<typeof forecastRequestSchema>;

/** "path: message" lines, one per problem. */
export function describeIssues(error: z.ZodError): string {
  return error.issues
    .map((i) => `${i.path.length > 0 ? i.path.join('.') : '(input)'}: ${i.message}`)
    .join('\n');
}

/** Validate a forecast request; throws an Error whose message lists every problem. */
export function parseForecastRequest(input: unknown): ParsedForecastRequest {
  const result = forecastRequestSchema.safeParse(input);
  if (!result.success) throw new ForecastRequestError(describeIssues(result.error), result.error);
  return result.data;
}

export class ForecastRequestError extends Error {
  constructor(
    message: string,
    readonly zodError: z.ZodError,
  ) {
    super(message);
    this.name = 'ForecastRequestError';
  }
}
