// A job worker process (scripts/worker.ts) killed with SIGKILL in the middle of a fit job and of a
// forecast job, with the real database and queue. The worker is inside the job for certain: a session
// of the test holds a lock the job's own transaction needs, and PostgreSQL shows the worker's session
// waiting on it (for the fit, after it has deleted and rewritten the plate's fits, none committed). After
// the kill a second worker process starts: the queue finds the job lost once its expiry has passed and
// retries it, the retry is visible as the job's second attempt, and the plate ends with one complete set
// of fits (one forecast), never half of one.
//
// The expiry is shortened through the deployment's own settings (lib/env.ts), set here before the queue
// starts and inherited by the worker processes: a job may stay taken 20 s, and lost jobs are looked for
// every second. A retried forecast is computed again in full, so the expiry leaves it room.
process.env.GATEWELL_JOB_EXPIRE_SECONDS = '20';
process.env.GATEWELL_JOB_MAINTENANCE_SECONDS = '1';

import { spawn, type ChildProcess } from 'node:child_process';
import { setTimeout as sleep } from 'node:timers/promises';
import { QueryTypes } from 'sequelize';
import { afterAll, afterEach, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { closeForecastPool } from '@/lib/compute/forecast-pool';
import { db } from '@/lib/db';
import { getPlateForecast, listPlateForecasts } from '@/lib/forecasts/plate-forecast';
import { waitForJob } from '@/lib/jobs/progress';
import { jobQueue } from '@/lib/jobs/queue';
import { startJobWorkers, stopJobWorkers } from '@/lib/jobs/worker';
import { commitImport } from '@/lib/plates/import-service';
import { ComputeJob, Fit, Forecast, Plate } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { demoCommitRequest } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';
import { holdLocks, type LockHolder } from '../support/lock-holder';
import { pollFor } from '../support/test-cluster';

const rows = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  db().query<T>(sql, { type: QueryTypes.SELECT, replacements });

/** A worker process as an operator starts one, taking only the given kinds. */
function startWorker(kinds: { fits: number; forecasts: number }, output: string[]): ChildProcess {
  const child = spawn(
    process.execPath,
    [
      '--conditions=react-server',
      '--import',
      'tsx',
      'scripts/worker.ts',
      '--fits',
      String(kinds.fits),
      '--forecasts',
      String(kinds.forecasts),
      '--imports',
      '0',
      '--scheduling',
      'nice',
      '--nice',
      '0',
    ],
    { env: { ...process.env, NODE_ENV: 'production' }, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  child.stdout!.on('data', (d: Buffer) => output.push(d.toString()));
  child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
  return child;
}

const exited = (child: ChildProcess) =>
  new Promise<NodeJS.Signals | number | null>((resolve) =>
    child.exitCode !== null || child.signalCode !== null
      ? resolve(child.signalCode ?? child.exitCode)
      : child.once('exit', (code, signal) => resolve(signal ?? code)),
  );

/** Waits until PostgreSQL no longer has the session (a killed client's backend ends once it reads the closed socket). */
async function backendGone(pid: number): Promise<void> {
  for (let i = 0; i < 200; i++) {
    const [row] = await rows<{ n: number }>(
      'select count(*)::int as n from pg_stat_activity where pid = :pid',
      {
        pid,
      },
    );
    if (row!.n === 0) return;
    await sleep(50);
  }
  throw new Error(`the killed worker's database session ${pid} did not end`);
}

/**
 * Kills the worker while its session waits on the holder's lock, inside the job's transaction, then
 * lets the held lock go; returns the killed session's transaction id (null when it had written nothing).
 */
async function killInsideJob(worker: ChildProcess, holder: LockHolder, waitMs: number) {
  const [waiter] = await holder.waiters(1, waitMs);
  const [session] = await rows<{ app: string; xid: string | null; xact: boolean }>(
    `select application_name as app, backend_xid::text as xid, xact_start is not null as xact
       from pg_stat_activity where pid = :pid`,
    { pid: waiter!.pid },
  );
  expect(waiter!.blockedBy).toEqual([holder.pid]);
  expect(session!.xact).toBe(true);
  worker.kill('SIGKILL');
  expect(await exited(worker)).toBe('SIGKILL');
  await holder.release();
  await backendGone(waiter!.pid);
  return session!.xid;
}

describe('a worker killed in the middle of a job', () => {
  let biologist: Actor;
  let screens: Record<string, string>;
  const workers: ChildProcess[] = [];
  const output: string[] = [];

  beforeEach(async () => {
    // Only the worker processes of the test take jobs; this process queues them.
    await stopJobWorkers();
    await jobQueue();
    await resetDatabase();
    const chemist = await makeActor(['chemist']);
    screens = await makeDemoScreens(await makeActor(['admin']), chemist);
    biologist = await makeActor(['biologist']);
    output.length = 0;
  });
  afterEach(async () => {
    for (const child of workers)
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
    await Promise.all(workers.map(exited));
    workers.length = 0;
  });
  afterAll(async () => {
    await stopJobWorkers();
    await closeForecastPool();
    await db().close();
  });

  test(
    'mid-fit: the fit job is retried by another worker and the plate gets one complete set of fits',
    {
      timeout: 180_000,
    },
    async () => {
      const plateId = (
        await commitImport(biologist, await demoCommitRequest(biologist, screens, 'nav-96-plate-01.xlsx'))
      ).plateId;
      const [job] = await ComputeJob.findAll({ where: { plateId, kind: 'plate-fits' } });
      expect(job).toMatchObject({ state: 'queued', attempts: 0 });
      const [queued] = await rows<{ expire: number }>(
        'select extract(epoch from expire_in)::int as expire from pgboss.job where id = :id',
        { id: job!.id },
      );
      expect(queued!.expire).toBe(20); // the configured expiry, shorter than the kind's own 120 s

      // The fit job deletes and rewrites the plate's fits, then marks the plate fitted: that last write waits here.
      const holder = await holdLocks([{ sql: 'lock table plates in share mode' }]);
      const first = startWorker({ fits: 1, forecasts: 0 }, output);
      workers.push(first);
      let xid: string | null;
      try {
        xid = await killInsideJob(first, holder, 30_000);
      } finally {
        await holder.release();
      }
      expect(xid, 'the killed fit had written rows in its transaction').toMatch(/^\d+$/);

      // Nothing of the killed attempt is left: no fits, the plate still waits for them, the job is still taken.
      expect(await Fit.count({ where: { plateId } })).toBe(0);
      expect(await Plate.findByPk(plateId)).toMatchObject({ fitsPending: true, fittedAt: null });
      expect(await ComputeJob.findByPk(job!.id)).toMatchObject({
        state: 'running',
        attempts: 1,
        worker: expect.stringMatching(new RegExp(`:${first.pid}$`)),
      });

      const second = startWorker({ fits: 1, forecasts: 0 }, output);
      workers.push(second);
      await fitsCurrent(plateId, 90_000);

      // One complete set: the demo plate's five compound × target pairs (seeders/data/demo-plates manifest), each once.
      const fits = await Fit.findAll({ where: { plateId } });
      expect(fits).toHaveLength(5);
      expect(new Set(fits.map((f) => `${f.compoundId}/${f.targetId}`)).size).toBe(5);
      const finished = await ComputeJob.findAll({ where: { plateId, kind: 'plate-fits' } });
      expect(finished, output.join('')).toHaveLength(1);
      expect(finished[0]).toMatchObject({
        id: job!.id,
        state: 'done',
        attempts: 2,
        message: '5 fit(s) computed.',
        worker: expect.stringMatching(new RegExp(`:${second.pid}$`)),
      });
      // The queue marks the job completed just after the handler has written its row: wait for that.
      const onQueue = await pollFor(async () => {
        const [row] = await rows<{ state: string; retries: number }>(
          'select state::text, retry_count as retries from pgboss.job where id = :id',
          { id: job!.id },
        );
        return row?.state === 'active' ? undefined : row;
      }, 'the queue kept the retried fit job active');
      expect(onQueue).toMatchObject({ state: 'completed', retries: 1 });
    },
  );

  test(
    'mid-forecast: the forecast job is retried by another worker and one forecast is stored',
    {
      timeout: 180_000,
    },
    async () => {
      const plateId = (
        await commitImport(biologist, await demoCommitRequest(biologist, screens, 'nav-96-plate-01.xlsx'))
      ).plateId;
      await startJobWorkers({ kinds: ['plate-fits'], sweep: false });
      await fitsCurrent(plateId);
      await stopJobWorkers();
      await jobQueue();
      const reader = await makeActor(['chemist']);
      const compound = (await listPlateForecasts(reader, plateId)).compounds.find(
        (c) => c.compound === 'GW-0001',
      )!;
      expect(compound).toMatchObject({ reason: null, stored: false });

      // The forecast job computes, then stores its row in a transaction: the insert waits here.
      const holder = await holdLocks([{ sql: 'lock table forecasts in share mode' }]);
      // A person asks for the forecast: the request queues the job and waits for it (lib/forecasts/store.ts).
      // Its own answer is not checked: it waits 45 s, and expiry and retry may take longer on a busy machine.
      const asked = getPlateForecast(reader, plateId, compound.compoundId).catch(() => undefined);
      const first = startWorker({ fits: 0, forecasts: 1 }, output);
      workers.push(first);
      try {
        await killInsideJob(first, holder, 60_000);
      } finally {
        await holder.release();
      }
      const [job] = await ComputeJob.findAll({ where: { plateId, kind: 'forecast' } });
      expect(job).toMatchObject({ state: 'running', attempts: 1 });
      expect(await Forecast.count({ where: { plateId } })).toBe(0);

      const second = startWorker({ fits: 0, forecasts: 1 }, output);
      workers.push(second);
      expect(await waitForJob(job!.id, 120_000)).toMatchObject({ state: 'done' });
      await asked;

      const stored = await Forecast.findAll({ where: { plateId } });
      expect(stored).toHaveLength(1);
      // Asked again, the person gets the stored one.
      const answer = await getPlateForecast(reader, plateId, compound.compoundId);
      expect(answer.forecast).toMatchObject({ reused: true, inputSha256: stored[0]!.inputSha256 });
      expect(await ComputeJob.findAll({ where: { plateId, kind: 'forecast' } })).toMatchObject([
        {
          id: job!.id,
          state: 'done',
          attempts: 2,
          message: 'Computed and stored.',
          worker: expect.stringMatching(new RegExp(`:${second.pid}$`)),
        },
      ]);
    },
  );
});
