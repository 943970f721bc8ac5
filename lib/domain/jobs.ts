// Kinds and states of queued jobs (table compute_jobs); lib/jobs/kinds.ts gives each kind its payload and retries.
export const COMPUTE_JOB_KINDS = ['plate-fits', 'forecast', 'plate-forecasts', 'plate-import'] as const;
export type ComputeJobKind = (typeof COMPUTE_JOB_KINDS)[number];
export const COMPUTE_JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type ComputeJobState = (typeof COMPUTE_JOB_STATES)[number];
