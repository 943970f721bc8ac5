import 'server-only';
import { hostname } from 'node:os';
import type PgBoss from 'pg-boss';
import { Op, QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { isAppError } from '@/lib/errors';
import { runPlateForecasts, type PlateForecastsJobData } from '@/lib/forecasts/plate-run';
import { computeAndStoreForecast, type ForecastJobData } from '@/lib/forecasts/store';
import { queueRefit, refitPlate } from '@/lib/plates/recompute';
import { ComputeJob } from '@/models';
import type { ComputeJobKind } from '@/models/compute-job';
import { runQueuedImport, type ImportJobData } from '@/lib/plates/import-jobs';
import { closeJobQueue, jobQueue, QUEUE_NAMES, QUEUE_SCHEMA, registerLocalWorker, wakeWorkers } from './queue';
import { listenForJobs } from './wake';

/** What a handler may report while it works. */
export type Progress = (done: number, total?: number) => Promise<void>;

type Handler = (data: Record<string, unknown>, progress: Progress, job: { id: string }) => Promise<string | null>;

const HANDLERS: Record<ComputeJobKind, Handler> = {
  'plate-fits': async (data) => {
    const { plateId, requestedBy } = data as { plateId: string; requestedBy: string | null };
    const outcome = await db().transaction((transaction) => refitPlate(plateId, requestedBy, transaction));
    return outcome.refitted ? `${outcome.fits} fit(s) computed.` : `Nothing to do: ${outcome.reason}.`;
  },
  forecast: async (data) => {
    const { owner, request } = data as unknown as ForecastJobData;
    const stored = await computeAndStoreForecast(owner, request);
    return stored.reused ? 'Already stored.' : 'Computed and stored.';
  },
  'plate-forecasts': async (data, progress) => runPlateForecasts(data as unknown as PlateForecastsJobData, progress),
  'plate-import': async (data, _progress, job) => runQueuedImport(data as unknown as ImportJobData, job.id),
};

/** Parallel jobs per queue in one worker process (each forecast also spreads over the forecast threads). */
export const DEFAULT_CONCURRENCY: Record<ComputeJobKind, number> = { 'plate-fits': 2, forecast: 2, 'plate-forecasts': 1, 'plate-import': 1 };

/** How often each worker process looks for plates whose fit job was lost, and for jobs that ended unseen. */
export const SWEEP_INTERVAL_MS = 60_000;

const workerName = `${hostname()}:${process.pid}`;

interface WorkerState {
  sweep: NodeJS.Timeout | null;
  running: boolean;
  wake: { stop(): Promise<void> } | null;
}
const STATE_KEY = Symbol.for('gatewell.jobs.worker');
const state: WorkerState = ((globalThis as Record<symbol, unknown>)[STATE_KEY] as WorkerState | undefined) ?? { sweep: null, running: false, wake: null };
(globalThis as Record<symbol, unknown>)[STATE_KEY] = state;

async function runJob(kind: ComputeJobKind, job: PgBoss.JobWithMetadata<Record<string, unknown>>): Promise<void> {
  db();
  const attempt = job.retryCount + 1;
  await ComputeJob.update({ state: 'running', startedAt: new Date(), attempts: attempt, worker: workerName, message: null }, { where: { id: job.id } });
  const progress: Progress = async (done, total) => {
    await ComputeJob.update(total === undefined ? { done } : { done, total }, { where: { id: job.id } });
  };
  try {
    const message = await HANDLERS[kind](job.data, progress, { id: job.id });
    // An import job records its end inside the plate's own transaction: that row is left as it is.
    await ComputeJob.update({ state: 'done', finishedAt: new Date(), message }, { where: { id: job.id, state: { [Op.ne]: 'done' } } });
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    // A refusal (bad input) will not change on a retry: the job ends here. Anything else is retried.
    const final = (isAppError(error) && error.code === 'invalid') || job.retryCount >= job.retryLimit;
    await ComputeJob.update(
      final
        ? { state: 'failed', finishedAt: new Date(), message: reason, outcome: isAppError(error) ? { code: error.code, details: error.details ?? null } : null }
        : { state: 'queued', message: `Attempt ${attempt} failed (${reason}); it will be tried again.` },
      { where: { id: job.id } },
    ).catch(() => undefined);
    if (!final) throw error;
    if (!isAppError(error)) console.error(`[gatewell jobs] ${kind} job ${job.id} failed: ${reason}`);
  }
}

/**
 * Repairs what a crash can leave: a compute_jobs row still open whose queue job has ended (marked
 * failed), a plate whose fits wait with no fit job open (a new one is queued), and an upload whose
 * import job has ended (removed). Returns the counts of the first two.
 */
export async function sweepJobs(): Promise<{ closed: number; requeued: number }> {
  const sequelize = db();
  const [, closed] = await sequelize.query(
    `update compute_jobs c set state = 'failed', finished_at = now(),
            message = 'The job ended on the queue without finishing (its worker stopped or it ran out of time).'
      where c.state in ('queued', 'running') and c.created_at < now() - interval '30 seconds'
        and not exists (select 1 from ${QUEUE_SCHEMA}.job j where j.id = c.id and j.state in ('created', 'retry', 'active'))`,
    { type: QueryTypes.UPDATE },
  );
  const stranded = await sequelize.query<{ id: string }>(
    `select p.id from plates p
      where p.fits_pending
        and not exists (select 1 from compute_jobs j where j.plate_id = p.id and j.kind = 'plate-fits' and j.state in ('queued', 'running'))`,
    { type: QueryTypes.SELECT },
  );
  for (const plate of stranded) await queueRefit(plate.id, null);
  // Uploads whose import job ended without removing them (a worker stopped, the database went away).
  await sequelize.query(
    `delete from import_uploads u
      where not exists (select 1 from compute_jobs c where c.job_key = 'plate-import:' || u.id::text and c.state in ('queued', 'running'))`,
  );
  return { closed: Number(closed ?? 0), requeued: stranded.length };
}

/**
 * Starts this process's workers on every queue (or the given kinds) and the periodic sweep. Any
 * number of processes on any number of machines may do this against one database: each job goes
 * to exactly one worker.
 */
export async function startJobWorkers(options: { kinds?: ComputeJobKind[]; concurrency?: Partial<Record<ComputeJobKind, number>>; sweep?: boolean } = {}): Promise<void> {
  if (state.running) return;
  state.running = true;
  const boss = await jobQueue();
  const kinds = options.kinds ?? (Object.keys(HANDLERS) as ComputeJobKind[]);
  state.wake = listenForJobs((kind) => { if (kinds.includes(kind)) wakeWorkers(kind); });
  for (const kind of kinds) {
    const count = options.concurrency?.[kind] ?? DEFAULT_CONCURRENCY[kind];
    for (let i = 0; i < count; i++) {
      const id = await boss.work<Record<string, unknown>>(
        QUEUE_NAMES[kind],
        { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true },
        async ([job]) => { if (job) await runJob(kind, job); },
      );
      registerLocalWorker(kind, id);
    }
  }
  if (options.sweep !== false) {
    const sweep = () => sweepJobs().catch((error: unknown) => console.error(`[gatewell jobs] sweep failed: ${error instanceof Error ? error.message : String(error)}`));
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
