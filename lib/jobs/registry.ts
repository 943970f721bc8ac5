import 'server-only';
import type { z } from 'zod';
import { AppError } from '@/lib/errors';
import { runPlateForecasts } from '@/lib/forecasts/plate-run';
import { runForecastJob } from '@/lib/forecasts/store';
import { sweepImports, runQueuedImport } from '@/lib/plates/import-jobs';
import { requeueLostRefits, runPlateFitsJob } from '@/lib/plates/recompute';
import type { ComputeJobKind } from '@/lib/domain/jobs';
import type { JobHandler, JobKindDefinition, PayloadSchema, RegisteredJobKind } from './job-types';
import { describePayloadIssues, JOB_KINDS } from './kinds';

/**
 * The registry the worker reads: each kind of job with its definition (queue, payload schema, retry
 * policy; lib/jobs/kinds.ts), its handler, how many of its jobs one worker process runs at once (each
 * forecast also spreads over the forecast threads), and what the periodic sweep repairs for it.
 * Only lib/jobs/worker.ts imports this module; the modules that queue jobs import lib/jobs/queue.ts.
 */
export const jobRegistry: Record<ComputeJobKind, RegisteredJobKind> = {
  'plate-fits': register(JOB_KINDS['plate-fits'], runPlateFitsJob, {
    concurrency: 2,
    sweep: requeueLostRefits,
  }),
  forecast: register(JOB_KINDS.forecast, runForecastJob, { concurrency: 2 }),
  'plate-forecasts': register(JOB_KINDS['plate-forecasts'], runPlateForecasts, { concurrency: 1 }),
  'plate-import': register(JOB_KINDS['plate-import'], runQueuedImport, {
    concurrency: 1,
    sweep: sweepImports,
  }),
};

/**
 * A registry entry whose `run` checks the stored payload against the kind's schema before the handler
 * sees it: a payload that fails ends the job as refused ("invalid", never retried) with every problem
 * in its message and details.
 */
function register<Payload extends PayloadSchema>(
  definition: JobKindDefinition<Payload>,
  handler: JobHandler<z.output<Payload>>,
  options: { concurrency: number; sweep?: () => Promise<number> },
): RegisteredJobKind {
  return {
    definition,
    ...options,
    run: async (data, context) => {
      const parsed = definition.payload.safeParse(data);
      if (!parsed.success) {
        throw new AppError(
          'invalid',
          `The job's payload is not valid, so it was not run: ${describePayloadIssues(parsed.error)}.`,
          { issues: parsed.error.issues },
        );
      }
      return handler(parsed.data, context);
    },
  };
}
