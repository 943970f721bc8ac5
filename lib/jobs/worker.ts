import 'server-only';
import { hostname } from 'node:os';
import type PgBoss from 'pg-boss';
import { Op } from 'sequelize';
import { db } from '@/lib/db';
import { untilDatabaseAnswers } from '@/lib/database-unavailable';
import { isAppError } from '@/lib/errors';
import { ComputeJob } from '@/models';
import { COMPUTE_JOB_KINDS, type ComputeJobKind } from '@/lib/domain/jobs';
import type { JobContext } from './job-types';
import { closeJobsEndedOnQueue } from './queries';
import { closeJobQueue, jobQueue, registerLocalWorker, wakeWorkers } from './queue';
import { jobRegistry } from './registry';
import { listenForJobs } from './wake';

/**
 * The worker: takes jobs from the queues of the kinds in the registry (lib/jobs/registry.ts) and runs
 * each through its registry entry, recording state, attempts, worker and progress on its compute_jobs
 * row. It knows no kind of job by name.
 */

/** How often each worker process looks for plates whose fit job was lost, and for jobs that ended unseen. */
export const SWEEP_INTERVAL_MS = 60_000;

/** How long a worker keeps trying to record a job's end while the database is out of reach. */
const RECORD_WITHIN_MS = 60_000;

const workerName = `${hostname()}:${process.pid}`;

interface WorkerState {
  sweep: NodeJS.Timeout | null;
  running: boolean;
  wake: { stop(): Promise<void> } | null;
}
const STATE_KEY = Symbol.for('gatewell.jobs.worker');
const state: WorkerState = ((globalThis as Record<symbol, unknown>)[STATE_KEY] as
  WorkerState | undefined) ?? { sweep: null, running: false, wake: null };
(globalThis as Record<symbol, unknown>)[STATE_KEY] = state;

async function runJob(kind: ComputeJobKind, job: PgBoss.JobWithMetadata<unknown>): Promise<void> {
  db();
  const attempt = job.retryCount + 1;
  await ComputeJob.update(
    { state: 'running', startedAt: new Date(), attempts: attempt, worker: workerName, message: null },
    { where: { id: job.id } },
  );
  const context: JobContext = {
    id: job.id,
    progress: async (done, total) => {
      await ComputeJob.update(total === undefined ? { done } : { done, total }, { where: { id: job.id } });
    },
  };
  try {
    const message = await jobRegistry[kind].run(job.data, context);
    // An import job records its end inside the plate's own transaction: that row is left as it is.
    await untilDatabaseAnswers(
      () =>
        ComputeJob.update(
          { state: 'done', finishedAt: new Date(), message },
          { where: { id: job.id, state: { [Op.ne]: 'done' } } },
        ),
      RECORD_WITHIN_MS,
    );
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    // A refusal (bad input, a payload that fails its schema) will not change on a retry: the job ends here. Anything else is retried.
    const final = (isAppError(error) && error.code === 'invalid') || job.retryCount >= job.retryLimit;
    // Kept through a database restart: the job's row is what the person waiting reads.
    const record = () =>
      ComputeJob.update(
        final
          ? {
              state: 'failed',
              finishedAt: new Date(),
              message: reason,
              outcome: isAppError(error) ? { code: error.code, details: error.details ?? null } : null,
            }
          : { state: 'queued', message: `Attempt ${attempt} failed (${reason}); it will be tried again.` },
        // A job whose end was written in its own transaction (an import) keeps it.
        { where: { id: job.id, state: { [Op.ne]: 'done' } } },
      );
    await untilDatabaseAnswers(record, RECORD_WITHIN_MS).catch(() => undefined);
    if (!final) throw error;
    if (!isAppError(error)) console.error(`[gatewell jobs] ${kind} job ${job.id} failed: ${reason}`);
  }
}

/**
 * Repairs what a crash can leave: a compute_jobs row still open whose queue job has ended (marked
 * failed), and whatever each kind's own sweep repairs (a plate whose fits wait with no fit job open
 * gets a new one; an upload whose import job has ended is removed). Returns how many rows were closed
 * and how many jobs were queued again.
 */
export async function sweepJobs(): Promise<{ closed: number; requeued: number }> {
  db();
  const closed = await closeJobsEndedOnQueue();
  let requeued = 0;
  for (const kind of COMPUTE_JOB_KINDS) requeued += (await jobRegistry[kind].sweep?.()) ?? 0;
  return { closed, requeued };
}

/**
 * Starts this process's workers on every queue (or the given kinds) and the periodic sweep. Any
 * number of processes on any number of machines may do this against one database: each job goes
 * to exactly one worker.
 */
export async function startJobWorkers(
  options: {
    kinds?: ComputeJobKind[];
    concurrency?: Partial<Record<ComputeJobKind, number>>;
    sweep?: boolean;
  } = {},
): Promise<void> {
  if (state.running) return;
  state.running = true;
  const boss = await jobQueue();
  const kinds = options.kinds ?? [...COMPUTE_JOB_KINDS];
  state.wake = listenForJobs((kind) => {
    if (kinds.includes(kind)) wakeWorkers(kind);
  });
  for (const kind of kinds) {
    const entry = jobRegistry[kind];
    const count = options.concurrency?.[kind] ?? entry.concurrency;
    for (let i = 0; i < count; i++) {
      const id = await boss.work<unknown>(
        entry.definition.queue,
        { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true },
        async ([job]) => {
          if (job) await runJob(kind, job);
        },
      );
      registerLocalWorker(kind, id);
    }
  }
  if (options.sweep !== false) {
    const sweep = () =>
      sweepJobs().catch((error: unknown) =>
        console.error(
          `[gatewell jobs] sweep failed: ${error instanceof Error ? error.message : String(error)}`,
        ),
      );
    await sweep();
    state.sweep = setInterval(sweep, SWEEP_INTERVAL_MS);
    state.sweep.unref();
  }
}

/** Stops the sweep; the workers stop with the queue connection (closeJobQueue). */
export function stopJobSweep(): void {
  if (state.sweep) clearInterval(state.sweep);
  state.sweep = null;
  state.running = false;
  void state.wake?.stop();
  state.wake = null;
}

/** Stops this process's workers (waiting for jobs under way) and its queue connection. */
export async function stopJobWorkers(): Promise<void> {
  stopJobSweep();
  await closeJobQueue();
}
