import 'server-only';
import type { z } from 'zod';

/**
 * The shapes shared by the queue, the registry, the worker and the handlers. A module of its own, with
 * no imports of Gatewell code, so that a handler can name them without importing the worker back.
 */

/** What a handler may report while it works: how many items are done, and the total when it is known. */
export type Progress = (done: number, total?: number) => Promise<void>;

/** What a handler gets besides its payload: the job's id (its compute_jobs row) and progress reporting. */
export interface JobContext {
  id: string;
  progress: Progress;
}

/** A handler: does the job's work and returns the line people see when it is done (null for none). */
export type JobHandler<Payload> = (payload: Payload, context: JobContext) => Promise<string | null>;

/** How often a failed job is tried again: at most `limit` more times, `delaySeconds` apart (doubling with `backoff`). */
export interface RetryPolicy {
  limit: number;
  delaySeconds?: number;
  backoff?: boolean;
}

/**
 * One kind of job as the queue knows it: its pg-boss queue, the zod schema of its payload (checked when
 * enqueued and again when run), its retry policy, and how long a worker may hold it. `policy` is the
 * queue's pg-boss policy: "short" keeps at most one job per key waiting, "standard" keeps every job.
 */
/** A payload schema: every payload is a JSON object. */
export type PayloadSchema = z.ZodType<Record<string, unknown>>;

export interface JobKindDefinition<Payload extends PayloadSchema = PayloadSchema> {
  queue: string;
  policy: 'short' | 'standard';
  payload: Payload;
  retry: RetryPolicy;
  expireInSeconds: number;
}

/** A kind in the worker's registry: its definition, its handler and how many of its jobs one process runs at once. */
export interface RegisteredJobKind {
  definition: JobKindDefinition;
  concurrency: number;
  /** Checks the stored payload against the kind's schema and runs the handler with it. */
  run: (data: unknown, context: JobContext) => Promise<string | null>;
  /** Repairs what a crash can leave for this kind; returns how many jobs it queued again. */
  sweep?: () => Promise<number>;
}
