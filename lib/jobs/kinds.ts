import 'server-only';
import type PgBoss from 'pg-boss';
import type { z } from 'zod';
import type { ComputeJobKind } from '@/lib/domain/jobs';
import type { JobKindDefinition } from './job-types';
import {
  forecastPayloadSchema,
  plateFitsPayloadSchema,
  plateForecastsPayloadSchema,
  plateImportPayloadSchema,
} from './payloads';

/**
 * Every kind of job as the queue knows it (queue, payload schema, retry policy). Policy "short": at
 * most one job per key waits, so a burst of changes to one plate queues one refit, and many people
 * asking for one forecast queue one computation. Imports are "standard": every upload is a job of its own.
 * The handlers are joined to these in lib/jobs/registry.ts, which only the worker reads.
 */
export const JOB_KINDS = {
  'plate-fits': {
    queue: 'gatewell-plate-fits',
    policy: 'short',
    payload: plateFitsPayloadSchema,
    retry: { limit: 3, delaySeconds: 2, backoff: true },
    expireInSeconds: 120,
  },
  forecast: {
    queue: 'gatewell-forecast',
    policy: 'short',
    payload: forecastPayloadSchema,
    retry: { limit: 2, delaySeconds: 2 },
    expireInSeconds: 300,
  },
  'plate-forecasts': {
    queue: 'gatewell-plate-forecasts',
    policy: 'short',
    payload: plateForecastsPayloadSchema,
    retry: { limit: 1, delaySeconds: 5 },
    expireInSeconds: 3600,
  },
  // Never retried: the request waiting on the import has told the person what happened.
  'plate-import': {
    queue: 'gatewell-plate-import',
    policy: 'standard',
    payload: plateImportPayloadSchema,
    retry: { limit: 0 },
    expireInSeconds: 120,
  },
} as const satisfies Record<ComputeJobKind, JobKindDefinition>;

/** The payload a caller passes for a kind of job (the schema's input). */
export type JobPayload<Kind extends ComputeJobKind> = z.input<(typeof JOB_KINDS)[Kind]['payload']>;

/**
 * The pg-boss options of a kind's queue, from its definition; `expireCapSeconds` (the deployment's
 * GATEWELL_JOB_EXPIRE_SECONDS) shortens the time a job may stay taken before it counts as lost.
 */
export function queueOptions(kind: ComputeJobKind, expireCapSeconds?: number): PgBoss.Queue {
  const definition: JobKindDefinition = JOB_KINDS[kind];
  const { queue, policy, retry, expireInSeconds } = definition;
  return {
    name: queue,
    policy,
    retryLimit: retry.limit,
    expireInSeconds: Math.min(expireInSeconds, expireCapSeconds ?? expireInSeconds),
    ...(retry.delaySeconds === undefined ? {} : { retryDelay: retry.delaySeconds }),
    ...(retry.backoff === undefined ? {} : { retryBackoff: retry.backoff }),
  };
}

/** "path: message" for each problem of a payload, joined with "; ". */
export function describePayloadIssues(error: z.ZodError): string {
  return error.issues
    .map((issue) => `${issue.path.length > 0 ? issue.path.join('.') : '(payload)'}: ${issue.message}`)
    .join('; ');
}

/** A payload that does not match its kind's schema, refused before anything is written. */
export class JobPayloadError extends Error {
  constructor(
    readonly kind: ComputeJobKind,
    readonly issues: z.ZodError['issues'],
    described: string,
  ) {
    super(`The payload of a ${kind} job is not valid: ${described}`);
    this.name = 'JobPayloadError';
  }
}

/** The payload checked against its kind's schema (the parsed value), or a JobPayloadError. */
export function checkJobPayload(kind: ComputeJobKind, data: unknown): Record<string, unknown> {
  const definition: JobKindDefinition = JOB_KINDS[kind];
  const parsed = definition.payload.safeParse(data);
  if (!parsed.success)
    throw new JobPayloadError(kind, parsed.error.issues, describePayloadIssues(parsed.error));
  return parsed.data;
}
