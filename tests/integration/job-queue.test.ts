// Fits and forecasts as jobs on the PostgreSQL-backed queue (pg-boss) with the real database: the job is
// written with the change that needs it, one job waits per plate however many changes come, signatures
// wait for current fits, lost jobs are found again, forecast runs report progress, and separate worker
// processes (scripts/worker.ts, as on other machines) share the queue with each job done once.
import { spawn, type ChildProcess } from 'node:child_process';
import { setTimeout as sleep } from 'node:timers/promises';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { startPlateForecasts } from '@/lib/forecasts/plate-run';
import { getPlateForecast, listPlateForecasts } from '@/lib/forecasts/plate-forecast';
import { waitForJob } from '@/lib/jobs/progress';
import { closeJobQueue, jobQueue } from '@/lib/jobs/queue';
import { startJobWorkers, stopJobWorkers, sweepJobs } from '@/lib/jobs/worker';
import { listPlateFits, listPlateWells } from '@/lib/plates/detail';
import { commitImport } from '@/lib/plates/import-service';
import { setWellExclusion } from '@/lib/plates/review';
import { closeForecastPool } from '@/lib/compute/forecast-pool';
import { signPlateStep } from '@/lib/signoff/service';
import { ComputeJob, Fit, Plate, Signature } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { holdLocks } from '../support/lock-holder';
import { demoCommitRequest } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

const PASSWORD = 'test-password-123';
const one = async <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  (await db().query<T>(sql, { type: QueryTypes.SELECT, replacements }))[0]!;
const queued = (plateId: string) =>
  one<{ n: number }>(
    `select count(*)::int as n from pgboss.job where name = 'gatewell-plate-fits' and data->>'plateId' = :plateId and state = 'created'`,
    { plateId },
  );

describe('job queue for fits and forecasts', () => {
  let screens: Record<string, string>;
  let biologist: Actor;
  let chemist: Actor;

  async function importPlate(file: string, label?: string): Promise<string> {
    return (
      await commitImport(biologist, await demoCommitRequest(biologist, screens, file, label ? { label } : {}))
    ).plateId;
  }

  beforeAll(async () => {
    // This file starts and stops workers itself; the setup's in-process workers are stopped first.
    await stopJobWorkers();
  });
  beforeEach(async () => {
    await stopJobWorkers();
    await jobQueue();
    await resetDatabase();
    chemist = await makeActor(['chemist']);
    screens = await makeDemoScreens(await makeActor(['admin']), chemist);
    biologist = await makeActor(['biologist']);
  });
  afterAll(async () => {
    await stopJobWorkers();
    await closeForecastPool();
    await db().close();
  });

  test('an import commits its fit job with it; a refused import leaves no job behind', async () => {
    const plateId = await importPlate('nav-96-plate-01.xlsx');
    expect(await Plate.findByPk(plateId)).toMatchObject({ fitsPending: true, fittedAt: null });
    expect(await Fit.count({ where: { plateId } })).toBe(0);
    expect(await ComputeJob.findAll({ where: { plateId } })).toMatchObject([
      { kind: 'plate-fits', state: 'queued', requestedBy: biologist.id },
    ]);
    expect((await queued(plateId)).n).toBe(1);

    const jobsBefore = await one<{ n: number }>('select count(*)::int as n from pgboss.job');
    await expect(importPlate('nav-96-plate-01.xlsx', 'AGAIN')).rejects.toMatchObject({ code: 'conflict' });
    expect((await one<{ n: number }>('select count(*)::int as n from pgboss.job')).n).toBe(jobsBefore.n);
    expect(await ComputeJob.count()).toBe(1);

    await startJobWorkers({ sweep: false });
    await fitsCurrent(plateId);
    expect(await Fit.count({ where: { plateId } })).toBe(5);
    const [job] = await ComputeJob.findAll({ where: { plateId } });
    expect(job).toMatchObject({
      state: 'done',
      attempts: 1,
      message: '5 fit(s) computed.',
      worker: expect.stringMatching(/:\d+$/),
    });
    expect((await Plate.findByPk(plateId))!.fittedAt).toBeInstanceOf(Date);
  });

  test('a burst of changes queues one refit; signatures wait for it, in the service and in the database', async () => {
    const plateId = await importPlate('nav-96-plate-01.xlsx');
    await startJobWorkers({ sweep: false });
    await fitsCurrent(plateId);
    const before = (await listPlateFits(biologist, plateId)).find((f) => f.compound === 'GW-0001')!;
    await stopJobWorkers();
    await jobQueue();

    const wells = (await listPlateWells(biologist, plateId)).filter(
      (w) => w.compound === 'GW-0001' && w.qcReasons.length === 0,
    );
    await setWellExclusion(biologist, plateId, {
      wellIds: [wells[0]!.id],
      excluded: true,
      reason: 'first doubt',
    });
    await setWellExclusion(biologist, plateId, {
      wellIds: [wells[1]!.id],
      excluded: true,
      reason: 'second doubt',
    });
    expect((await queued(plateId)).n).toBe(1);
    expect(await ComputeJob.count({ where: { plateId, state: 'queued' } })).toBe(1);

    await expect(
      signPlateStep(chemist, plateId, { action: 'verify', password: PASSWORD }),
    ).rejects.toMatchObject({
      code: 'conflict',
      message: expect.stringMatching(/still being computed/),
    });
    expect(await Signature.count()).toBe(0);
    await expect(
      db().query("update plates set state = 'submitted' where id = :plateId", { replacements: { plateId } }),
    ).rejects.toThrow(/plates_fits_current_when_signed/);

    await startJobWorkers({ sweep: false });
    await fitsCurrent(plateId);
    const after = (await listPlateFits(biologist, plateId)).find((f) => f.compound === 'GW-0001')!;
    expect(after.n).toBe(before.n - 2); // both exclusions are in the one refit
    await signPlateStep(chemist, plateId, { action: 'verify', password: PASSWORD });
    expect((await Plate.findByPk(plateId))!.state).toBe('verified');
  });

  test('the sweep closes jobs that ended unseen and queues again a refit that was lost', async () => {
    const plateId = await importPlate('kv-96-plate-01.csv');
    const [job] = await ComputeJob.findAll({ where: { plateId } });
    // As if the queue had lost the job (a crash between commit and take, or a purge): gone from pg-boss.
    await db().query('delete from pgboss.job where id = :id', { replacements: { id: job!.id } });
    await db().query("update compute_jobs set created_at = now() - interval '5 minutes' where id = :id", {
      replacements: { id: job!.id },
    });
    expect(await sweepJobs()).toEqual({ closed: 1, requeued: 1 });
    expect((await ComputeJob.findByPk(job!.id))!.state).toBe('failed');
    expect(await ComputeJob.count({ where: { plateId, state: 'queued' } })).toBe(1);
    expect(await sweepJobs()).toEqual({ closed: 0, requeued: 0 }); // nothing twice
    await startJobWorkers({ sweep: false });
    await fitsCurrent(plateId);
    expect(await Fit.count({ where: { plateId } })).toBe(5);
  });

  test('a forecast is a job: computed once by a worker, stored, and reused', async () => {
    const plateId = await importPlate('nav-96-plate-01.xlsx');
    await startJobWorkers({ sweep: false });
    await fitsCurrent(plateId);
    const reader = await makeActor(['approver']);
    const compound = (await listPlateForecasts(reader, plateId)).compounds.find(
      (c) => c.compound === 'GW-0001',
    )!;
    // The race is forced: a transaction of the test locks compute_jobs against writes, both requests start,
    // and PostgreSQL shows one waiting to write its job row (holding the job key's lock) and the other
    // waiting for that key's lock, so both found nothing stored and both are enqueueing. Without the key's
    // lock (lib/jobs/queries.ts) both would wait on the table, and two jobs would be written.
    const holder = await holdLocks([{ sql: 'lock table compute_jobs in exclusive mode' }]);
    let first: Awaited<ReturnType<typeof getPlateForecast>>;
    let second: typeof first;
    try {
      const racing = Promise.all([
        getPlateForecast(reader, plateId, compound.compoundId),
        getPlateForecast(reader, plateId, compound.compoundId),
      ]);
      const waiters = await holder.waiters(2);
      const writing = waiters.find((w) => w.blockedBy.includes(holder.pid))!;
      expect(writing).toMatchObject({ waitEvent: 'relation', blockedBy: [holder.pid] });
      expect(waiters.find((w) => w !== writing)).toMatchObject({
        waitEvent: 'advisory',
        blockedBy: [writing.pid],
      });
      await holder.release();
      [first, second] = await racing;
    } finally {
      await holder.release();
    }
    expect(first.forecast!.inputSha256).toBe(second.forecast!.inputSha256);
    const jobs = await ComputeJob.findAll({ where: { plateId, kind: 'forecast' } });
    expect(jobs).toHaveLength(1); // the second request joined the first one’s job
    expect(jobs[0]).toMatchObject({ state: 'done', compoundId: compound.compoundId, requestedBy: reader.id });
    expect((await getPlateForecast(reader, plateId, compound.compoundId)).forecast!.reused).toBe(true);
    expect(await ComputeJob.count({ where: { plateId, kind: 'forecast' } })).toBe(1);
  });

  test('a forecast run over a plate reports progress and stores every missing forecast', async () => {
    const plateId = await importPlate('nav-96-plate-01.xlsx');
    await startJobWorkers({ sweep: false });
    await fitsCurrent(plateId);
    const reader = await makeActor(['chemist']);
    const todo = (await listPlateForecasts(reader, plateId)).compounds.filter(
      (c) => c.reason === null && !c.stored,
    );
    expect(todo.length).toBeGreaterThan(1);
    const run = await startPlateForecasts(reader, plateId, null);
    expect(run).toMatchObject({ created: true, total: todo.length });
    const finished = await waitForJob(run.id, 120_000);
    expect(finished).toMatchObject({
      state: 'done',
      done: todo.length,
      total: todo.length,
      kind: 'plate-forecasts',
    });
    expect(
      (await listPlateForecasts(reader, plateId)).compounds.filter((c) => c.reason === null && !c.stored),
    ).toHaveLength(0);
    await expect(startPlateForecasts(reader, plateId, null)).rejects.toMatchObject({ code: 'conflict' });
  });

  test('worker processes started from scripts/ share the queue: every plate fitted once', async () => {
    const plates = [
      await importPlate('nav-96-plate-01.xlsx'),
      await importPlate('kv-96-plate-01.csv'),
      await importPlate('nav-384-plate-02.xlsx'),
      await importPlate('nav-96-plate-03-noisy.xlsx'),
    ];
    await closeJobQueue();
    const workers: ChildProcess[] = [];
    const output: string[] = [];
    try {
      for (let i = 0; i < 2; i++) {
        const child = spawn(
          process.execPath,
          [
            '--conditions=react-server',
            '--import',
            'tsx',
            'scripts/worker.ts',
            '--fits',
            '1',
            '--forecasts',
            '0',
          ],
          {
            env: { ...process.env, NODE_ENV: 'production' },
            stdio: ['ignore', 'pipe', 'pipe'],
          },
        );
        child.stdout!.on('data', (d: Buffer) => output.push(d.toString()));
        child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
        workers.push(child);
      }
      for (const plateId of plates) await fitsCurrent(plateId, 60_000);
    } finally {
      for (const child of workers) child.kill('SIGTERM');
      await Promise.all(
        workers.map(
          (child) =>
            new Promise((resolve) => (child.exitCode !== null ? resolve(null) : child.once('exit', resolve))),
        ),
      );
    }
    const jobs = await ComputeJob.findAll({ where: { kind: 'plate-fits' } });
    expect(jobs).toHaveLength(4);
    expect(jobs.every((j) => j.state === 'done' && j.attempts === 1)).toBe(true);
    const pids = new Set(workers.map((w) => String(w.pid)));
    expect(
      jobs.every((j) => pids.has(j.worker!.split(':').pop()!)),
      output.join(''),
    ).toBe(true);
    expect(output.join('')).toMatch(/taking jobs/);
    for (const plateId of plates) expect(await Fit.count({ where: { plateId } })).toBeGreaterThan(0);
    await sleep(10);
  });
});
