import 'server-only';
import PgBoss from 'pg-boss';
import type { ClientBase } from 'pg';
import { Op, type Transaction } from 'sequelize';
import { db } from '@/lib/db';
import { env } from '@/lib/env';
import { ComputeJob } from '@/models';
import { COMPUTE_JOB_KINDS, type ComputeJobKind } from '@/lib/domain/jobs';
import { checkJobPayload, JOB_KINDS, queueOptions, type JobPayload } from './kinds';
import { lockJobKey, QUEUE_SCHEMA } from './queries';
import { notifyWorkers } from './wake';

/**
 * Gatewell's job queue: fits and forecasts are jobs on pg-boss queues in the same PostgreSQL database
 * (schema "pgboss"), taken by worker processes on any machine that reaches the database
 * (scripts/worker.ts, and the web server itself unless GATEWELL_JOB_WORKER=off). Each job also has a
 * compute_jobs row, written in the same transaction as the job, that holds what people see of it.
 * What each kind is (queue, payload schema, retry policy) is in lib/jobs/kinds.ts.
 */

export { QUEUE_SCHEMA };

interface QueueState {
  boss: Promise<PgBoss> | null;
  /** Ids of the workers this process runs, per queue, so that a commit here can wake them at once. */
  workers: Map<ComputeJobKind, string[]>;
}

// On globalThis so that Next's separate server bundles and development reloads share one connection.
const STATE_KEY = Symbol.for('gatewell.jobs.queue');
const state: QueueState = ((globalThis as Record<symbol, unknown>)[STATE_KEY] as QueueState | undefined) ?? {
  boss: null,
  workers: new Map(),
};
(globalThis as Record<symbol, unknown>)[STATE_KEY] = state;

/** The process's pg-boss instance, started (schema created or migrated) and with every queue in place. */
export function jobQueue(): Promise<PgBoss> {
  state.boss ??= (async () => {
    const boss = new PgBoss({
      connectionString: env().DATABASE_URL,
      schema: QUEUE_SCHEMA,
      application_name: 'gatewell-jobs',
      max: 4,
      schedule: false,
      // A job whose worker died stays taken until its expiry; this pass finds it and retries it.
      maintenanceIntervalSeconds: env().GATEWELL_JOB_MAINTENANCE_SECONDS,
    });
    boss.on('error', (error: Error) => console.error(`[gatewell jobs] ${error.message}`));
    await boss.start();
    for (const kind of COMPUTE_JOB_KINDS) {
      const options = queueOptions(kind, env().GATEWELL_JOB_EXPIRE_SECONDS);
      // createQueue leaves an existing queue as it was: the update carries changed retry and expiry settings to it.
      await boss.createQueue(options.name, options);
      await boss.updateQueue(options.name, options);
    }
    return boss;
  })().catch((error: unknown) => {
    state.boss = null;
    throw error;
  });
  return state.boss;
}

/** Stops the queue connection of this process (its workers stop with it), waiting for jobs under way. */
export async function closeJobQueue(): Promise<void> {
  const pending = state.boss;
  state.boss = null;
  state.workers.clear();
  if (!pending) return;
  const boss = await pending.catch(() => null);
  await boss?.stop({ graceful: true, wait: true, timeout: 20_000 });
}

/** Remembers a worker of this process so that jobs committed here wake it without waiting for its poll. */
export function registerLocalWorker(kind: ComputeJobKind, workerId: string): void {
  state.workers.set(kind, [...(state.workers.get(kind) ?? []), workerId]);
}

function wakeLocalWorkers(boss: PgBoss, kind: ComputeJobKind): void {
  for (const id of state.workers.get(kind) ?? []) boss.notifyWorker(id);
}

/** Wakes this process's workers of a kind at once (a job was queued by another process: lib/jobs/wake.ts). */
export function wakeWorkers(kind: ComputeJobKind): void {
  void state.boss?.then(
    (boss) => wakeLocalWorkers(boss, kind),
    () => undefined,
  );
}

/** Cancels a job that no worker has taken (its compute_jobs row is the caller's to close). */
export async function cancelJob(kind: ComputeJobKind, jobId: string): Promise<void> {
  const boss = await jobQueue();
  await boss.cancel(JOB_KINDS[kind].queue, jobId);
}

/** pg-boss writes the job through the transaction's own connection, so the job exists only if the transaction commits. */
function throughTransaction(transaction: Transaction): PgBoss.Db {
  const connection = (transaction as unknown as { connection: ClientBase }).connection;
  return { executeSql: (text, values) => connection.query(text, values) };
}

export interface JobRequest<Kind extends ComputeJobKind = ComputeJobKind> {
  kind: Kind;
  /** The work it stands for; a second request with the same key while one waits joins that one. */
  key: string;
  /** The payload, checked against the kind's schema (lib/jobs/payloads.ts) before anything is written. */
  data: JobPayload<Kind>;
  plateId?: string | null;
  compoundId?: string | null;
  requestedBy: string | null;
  total?: number | null;
  /**
   * Join a job with the same key that a worker is already running, not only one that waits. Right
   * when the result depends on the key alone (a forecast of one input); wrong for a refit, which
   * must see changes made after the running job read the plate.
   */
  joinRunning?: boolean;
}

export interface QueuedJob {
  id: string;
  /** False when an identical job was already waiting and this request joined it. */
  created: boolean;
}

/**
 * Puts a job on its queue with its compute_jobs row, inside the caller's transaction when given (the
 * job then exists only if that transaction commits), otherwise in a transaction of its own. A payload
 * that does not match its kind's schema is refused with a JobPayloadError before anything is written.
 */
export async function enqueueJob<Kind extends ComputeJobKind>(
  request: JobRequest<Kind>,
  transaction?: Transaction,
): Promise<QueuedJob> {
  const data = checkJobPayload(request.kind, request.data);
  const boss = await jobQueue();
  const open = (t: Transaction, states: ComputeJob['state'][]) =>
    ComputeJob.findOne({
      where: { jobKey: request.key, kind: request.kind, state: { [Op.in]: states } },
      order: [['createdAt', 'DESC']],
      transaction: t,
    });
  const run = async (t: Transaction): Promise<QueuedJob> => {
    // One enqueue per key at a time: a second request sees the first one's job once it is committed.
    await lockJobKey(request.key, t);
    if (request.joinRunning) {
      const running = await open(t, ['queued', 'running']);
      if (running) return { id: running.id, created: false };
    }
    const id = await boss.send(JOB_KINDS[request.kind].queue, data, {
      singletonKey: request.key,
      db: throughTransaction(t),
    });
    if (id) {
      await ComputeJob.create(
        {
          id,
          kind: request.kind,
          jobKey: request.key,
          plateId: request.plateId ?? null,
          compoundId: request.compoundId ?? null,
          requestedBy: request.requestedBy,
          total: request.total ?? null,
        },
        { transaction: t },
      );
      await notifyWorkers(request.kind, t); // workers in other processes, on commit
      t.afterCommit(() => wakeLocalWorkers(boss, request.kind));
      return { id, created: true };
    }
    const waiting = await open(t, ['queued', 'running']);
    if (!waiting)
      throw new Error(`job ${request.key} was refused by the queue and no waiting job has that key`);
    return { id: waiting.id, created: false };
  };
  return transaction ? run(transaction) : db().transaction(run);
}
