import { z } from 'zod';
import { COMPUTE_JOB_KINDS, COMPUTE_JOB_STATES } from '@/lib/domain/jobs';

/** One queued fit or forecast job as the plate page shows it (lib/jobs/progress.ts). */
export const jobViewSchema = z.object({
  id: z.uuid(),
  kind: z.enum(COMPUTE_JOB_KINDS),
  state: z.enum(COMPUTE_JOB_STATES),
  done: z.number().int(),
  total: z.number().int().nullable(),
  message: z.string().nullable(),
  attempts: z.number().int(),
  worker: z.string().nullable(),
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
});
export type JobViewData = z.infer<typeof jobViewSchema>;

export const plateJobsSchema = z.object({
  fitsPending: z.boolean(),
  fittedAt: z.string().nullable(),
  jobs: z.array(jobViewSchema),
});
export type PlateJobsData = z.infer<typeof plateJobsSchema>;

/** Starting a forecast run over a plate: optionally the exposure (index) for the traces. */
export const startForecastRunSchema = z
  .object({
    at: z
      .number({ error: 'at must be the index of one of the screen’s exposures.' })
      .int()
      .min(0)
      .max(50)
      .optional(),
  })
  .strict();

export const startedJobSchema = z.object({ id: z.uuid(), created: z.boolean(), total: z.number().int() });
