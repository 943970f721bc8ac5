import { BLOCK_READOUTS } from '@/lib/domain/fits';
import { z } from 'zod';
import { wellRoleSchema } from '@/lib/domain/well-roles';

/** Exclude or re-include wells: the same schema checks the form in the browser and the request on the server. */
export const exclusionSchema = z.object({
  wellIds: z.array(z.uuid()).min(1, 'Choose at least one well.').max(1536),
  excluded: z.boolean(),
  reason: z
    .string()
    .trim()
    .min(1, 'Give a reason for the change.')
    .max(500, 'Keep the reason under 500 characters.'),
  expectedVersion: z.int().positive().optional(),
});

export type ExclusionInput = z.infer<typeof exclusionSchema>;

export const fitModelSchema = z.object({
  compoundId: z.uuid(),
  targetId: z.uuid(),
  model: z.enum(['hill2', 'hill4']),
  expectedVersion: z.int().positive().optional(),
});

const qcReason = z.object({ code: z.string(), message: z.string() });

/** One readout of a well as the plate page receives it. */
export const wellRowSchema = z.object({
  id: z.uuid(),
  readoutId: z.uuid(),
  position: z.string(),
  rowIndex: z.number().int(),
  columnIndex: z.number().int(),
  role: wellRoleSchema,
  compoundId: z.uuid().nullable(),
  compound: z.string().nullable(),
  concentration_uM: z.number().nullable(),
  sealResistance_GOhm: z.number().nullable(),
  seriesResistance_MOhm: z.number().nullable(),
  capacitance_pF: z.number().nullable(),
  excluded: z.boolean(),
  exclusionReason: z.string().nullable(),
  targetId: z.uuid(),
  target: z.string(),
  controlCurrent_pA: z.number().nullable(),
  compoundCurrent_pA: z.number().nullable(),
  fractionalBlock: z.number().nullable(),
  qcReasons: z.array(qcReason),
  readout: z.enum(BLOCK_READOUTS),
});

export const wellsResponseSchema = z.object({
  version: z.number().int(),
  state: z.string(),
  wells: z.array(wellRowSchema),
});

/** What the browser draws a fit's curve and band from (`fitCurve`, lib/science/fit/hill-band.ts). */
const curveBasis = z.object({
  parameters: z.array(z.number()),
  covariance: z.array(z.array(z.number())).nullable(),
  degreesOfFreedom: z.number(),
  lowest_uM: z.number().positive(),
  highest_uM: z.number().positive(),
});

/** One fit with what its curve and band are drawn from, as the fits view receives it. */
export const fitViewSchema = z.object({
  id: z.uuid(),
  compoundId: z.uuid(),
  compound: z.string(),
  targetId: z.uuid(),
  target: z.string(),
  conductance: z.string(),
  readout: z.enum(BLOCK_READOUTS),
  readoutName: z.string().nullable(),
  model: z.enum(['hill2', 'hill4']),
  status: z.enum(['fitted', 'above_range', 'inactive', 'insufficient', 'not_converged']),
  message: z.string(),
  ic50_uM: z.number().nullable(),
  ic50CiLow_uM: z.number().nullable(),
  ic50CiHigh_uM: z.number().nullable(),
  ic50LowerBound_uM: z.number().nullable(),
  log10Ic50Se: z.number().nullable(),
  hill: z.number().nullable(),
  top: z.number().nullable(),
  bottom: z.number().nullable(),
  r2: z.number().nullable(),
  residualSd: z.number().nullable(),
  n: z.number().int(),
  flags: z.array(qcReason),
  curveBasis: curveBasis.nullable(),
});

export const fitsResponseSchema = z.object({
  version: z.number().int(),
  state: z.string(),
  fitsPending: z.boolean(),
  fits: z.array(fitViewSchema),
});

export type WellRowView = z.infer<typeof wellRowSchema>;
export type WellsResponse = z.infer<typeof wellsResponseSchema>;
export type FitView = z.infer<typeof fitViewSchema>;
