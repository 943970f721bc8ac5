import 'server-only';
import { z } from 'zod';
import { forecastRequestSchema } from '@/lib/science/forecast/request-schema';

/**
 * The payload of each kind of job, as zod schemas: what a job carries on the queue. Checked when the
 * job is enqueued (a wrong payload is never written) and again when a worker runs it (a payload stored
 * by another version, or changed by hand, ends the job with the reason instead of breaking the worker).
 * Kept apart from the handlers so that the modules that queue jobs import no worker code.
 */

const id = (what: string) => z.uuid({ error: `${what} must be an id (UUID)` });

/** Refit of one plate; `requestedBy` is null for a refit the sweep queued again. */
export const plateFitsPayloadSchema = z.strictObject({
  plateId: id('plateId'),
  requestedBy: id('requestedBy').nullable(),
});
export type PlateFitsPayload = z.output<typeof plateFitsPayloadSchema>;

/** Who a forecast belongs to: a plate's compound (plateId) or a compound's profile (plateId null). */
export const forecastOwnerSchema = z.strictObject({
  plateId: id('owner.plateId').nullable(),
  compoundId: id('owner.compoundId'),
  screenId: id('owner.screenId'),
});

/** One forecast: its owner and the request (lib/science/forecast/request-schema.ts). */
export const forecastPayloadSchema = z.strictObject({
  owner: forecastOwnerSchema,
  request: forecastRequestSchema,
});
export type ForecastPayload = z.output<typeof forecastPayloadSchema>;

/** A forecast run over a plate: the exposure index for the traces (null: the highest) and who asked. */
export const plateForecastsPayloadSchema = z.strictObject({
  plateId: id('plateId'),
  at: z
    .int({ error: 'at must be a whole number or null' })
    .min(0, { error: 'at must be 0 or more' })
    .nullable(),
  requestedBy: id('requestedBy'),
});
export type PlateForecastsPayload = z.output<typeof plateForecastsPayloadSchema>;

/** An import: the upload kept in import_uploads. */
export const plateImportPayloadSchema = z.strictObject({
  uploadId: id('uploadId'),
});
export type PlateImportPayload = z.output<typeof plateImportPayloadSchema>;
