import 'server-only';
import { setTimeout as sleep } from 'node:timers/promises';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { ComputeJob, Plate } from '@/models';
import type { ComputeJobKind, ComputeJobState } from '@/lib/domain/jobs';

/** A job as people see it: what it is for, where it stands, and how far it has got. */
export interface JobView {
  id: string;
  kind: ComputeJobKind;
  state: ComputeJobState;
  done: number;
  total: number | null;
  message: string | null;
  attempts: number;
  worker: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

export function jobView(job: ComputeJob): JobView {
  return {
    id: job.id,
    kind: job.kind,
    state: job.state,
    done: job.done,
    total: job.total,
    message: job.message,
    attempts: job.attempts,
    worker: job.worker,
    createdAt: job.createdAt.toISOString(),
    startedAt: job.startedAt?.toISOString() ?? null,
    finishedAt: job.finishedAt?.toISOString() ?? null,
  };
}

/** Polls the job's row until it is done or failed, or the time is up (then it is returned as it stands). */
export async function waitForJob(jobId: string, timeoutMs: number): Promise<JobView> {
  db();
  const deadline = Date.now() + timeoutMs;
  for (let delay = 25; ; delay = Math.min(delay * 2, 250)) {
    const job = await ComputeJob.findByPk(jobId, { rejectOnEmpty: true });
    if (job.state === 'done' || job.state === 'failed' || Date.now() >= deadline) return jobView(job);
    await sleep(delay);
  }
}

export interface PlateJobs {
  /** True while the plate's fits wait for a refit after an import or a change. */
  fitsPending: boolean;
  fittedAt: string | null;
  /** The plate's jobs of the last day, newest first (at most 20). */
  jobs: JobView[];
}

/** The plate's fit state and recent jobs, for its progress line. */
export async function plateJobs(actor: Actor, plateId: string): Promise<PlateJobs> {
  void actor; // every signed-in role may read plates
  db();
  const plate = await Plate.findByPk(plateId, { attributes: ['id', 'fitsPending', 'fittedAt'] });
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const jobs = await ComputeJob.findAll({
    where: { plateId, kind: ['plate-fits', 'plate-forecasts'] },
    order: [['createdAt', 'DESC']],
    limit: 20,
  });
  const dayAgo = Date.now() - 24 * 3600_000;
  return {
    fitsPending: plate.fitsPending,
    fittedAt: plate.fittedAt?.toISOString() ?? null,
    jobs: jobs
      .filter((j) => j.createdAt.getTime() > dayAgo || j.state === 'queued' || j.state === 'running')
      .map(jobView),
  };
}
