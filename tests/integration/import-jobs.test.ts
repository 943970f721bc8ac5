// Imports as jobs on the real database and queue: the upload and its job are kept in one transaction, a
// worker stores the plate and removes the upload in one transaction, a refusal comes back to the waiting
// request with its code and reasons, an import no worker takes in time is withdrawn with nothing stored,
// and a job queued by one process wakes the workers of another through LISTEN/NOTIFY (also after the
// listening connection is cut).
import { setTimeout as sleep } from 'node:timers/promises';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { enqueueJob, QUEUE_SCHEMA } from '@/lib/jobs/queue';
import { listenForJobs } from '@/lib/jobs/wake';
import { startJobWorkers, stopJobWorkers, sweepJobs } from '@/lib/jobs/worker';
import { awaitImport, queueImport } from '@/lib/plates/import-jobs';
import type { CommitRequest } from '@/lib/plates/import-service';
import { ComputeJob, Plate } from '@/models';
import type { ComputeJobKind } from '@/lib/domain/jobs';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importRowCounts } from '../support/import-counts';
import { demoCommitRequest } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

const one = async <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  (await db().query<T>(sql, { type: QueryTypes.SELECT, replacements }))[0]!;
const uploads = async () => (await one<{ n: number }>('select count(*)::int as n from import_uploads')).n;

async function until(check: () => Promise<boolean> | boolean, ms = 10_000): Promise<void> {
  const deadline = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error('gave up waiting');
    await sleep(25);
  }
}

afterAll(() => db().close());

describe('imports as jobs', () => {
  let biologist: Actor;
  let screens: Record<string, string>;

  beforeEach(async () => {
    await startJobWorkers({ sweep: false });
    await resetDatabase();
    screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
  });
  afterAll(() => stopJobWorkers());

  async function request(
    file: string,
    label?: string,
    source: 'draft' | 'file' = 'draft',
  ): Promise<CommitRequest> {
    return demoCommitRequest(biologist, screens, file, { ...(label ? { label } : {}), source });
  }

  test('the waiting request is told the stages the worker reaches, in order', async () => {
    await stopJobWorkers(); // no worker yet: the import waits in the queue first
    const jobId = await queueImport(biologist, await request('nav-96-plate-01.xlsx', 'JOB-STAGES'));
    const told: string[] = [];
    const waiting = awaitImport(jobId, {}, (stage) => told.push(stage));
    await until(() => told.length > 0);
    expect(told).toEqual(['queued']);
    await startJobWorkers({ sweep: false });
    expect((await waiting).state).toBe('stored');
    // Polling may pass over a short stage, but never goes back or repeats one.
    const order = ['queued', 'reading', 'checking', 'storing'];
    expect(told.map((stage) => order.indexOf(stage))).toEqual(
      [...new Set(told.map((stage) => order.indexOf(stage)))].sort(),
    );
    expect(told.every((stage) => order.includes(stage))).toBe(true);
    // The worker reported all three of its stages on the job (done counts them).
    const job = await ComputeJob.findByPk(jobId, { rejectOnEmpty: true });
    expect({ done: job.done, total: job.total }).toEqual({ done: 3, total: 3 });
  });

  test('a queued import is stored by a worker, which removes the upload and puts the plate on the job', async () => {
    const jobId = await queueImport(biologist, await request('nav-96-plate-01.xlsx', 'JOB-P01'));
    expect(await uploads()).toBe(1);
    const result = await awaitImport(jobId);
    expect(result.state).toBe('stored');
    const plate = await Plate.findOne({ where: { label: 'JOB-P01' }, rejectOnEmpty: true });
    // The plates stored (one here; a file may hold several), the first also as plateId.
    expect(result).toEqual({
      state: 'stored',
      plateId: plate.id,
      plates: [{ plateId: plate.id, label: 'JOB-P01' }],
    });
    const job = await ComputeJob.findByPk(jobId, { rejectOnEmpty: true });
    expect(job).toMatchObject({
      kind: 'plate-import',
      state: 'done',
      plateId: plate.id,
      plateIds: [plate.id],
      requestedBy: biologist.id,
      message: 'Stored as plate JOB-P01.',
    });
    expect(await uploads()).toBe(0);
    // The job's end is written once, by the plate's own transaction: once the queue has closed the job,
    // its compute_jobs row still carries that transaction's id (xmin), as the import's audit row (never
    // updated) does.
    for (
      let i = 0;
      i < 100 &&
      (await one<{ state: string }>(`select state from ${QUEUE_SCHEMA}.job where id = :id`, { id: jobId }))
        .state !== 'completed';
      i++
    )
      await sleep(50);
    const writers = await one<{ job: string; audit: string }>(
      "select (select xmin::text from compute_jobs where id = :job) as job, (select xmin::text from audit_events where action = 'import' and entity_id = :plate) as audit",
      { job: jobId, plate: plate.id },
    );
    expect(writers.job).toBe(writers.audit);
    // The audit trail names the person who uploaded, not the worker.
    const audit = await one<{ actorId: string }>(
      'select actor_id as "actorId" from audit_events where action = \'import\' and entity_id = :id',
      { id: plate.id },
    );
    expect(audit.actorId).toBe(biologist.id);
  });

  test('a refused import reaches the waiting request as the same refusal, with its reasons, and writes nothing', async () => {
    const bad = {
      ...(await request('kv-96-plate-01.csv', undefined, 'file')),
      bytes: new TextEncoder().encode(
        'Well,Compound,Target,I control (pA),I compound (pA)\nA01,DMSO,Kv7.2,900,880\n',
      ),
    };
    const before = await importRowCounts();
    const jobId = await queueImport(biologist, bad);
    const refusal = await awaitImport(jobId).catch((error: unknown) => error);
    expect(refusal).toMatchObject({
      name: 'AppError',
      code: 'invalid',
      message: expect.stringMatching(/error/),
    });
    expect((refusal as { details: { issues: unknown[] } }).details.issues.length).toBeGreaterThan(0);
    expect(await importRowCounts()).toEqual(before);
    expect(await uploads()).toBe(0);
    expect(await ComputeJob.findByPk(jobId, { rejectOnEmpty: true })).toMatchObject({
      state: 'failed',
      outcome: { code: 'invalid' },
    });
  });

  test('the same file sent twice: the second import is refused as a duplicate', async () => {
    const file = await request('nav-96-plate-01.xlsx', 'JOB-TWICE', 'file');
    expect((await awaitImport(await queueImport(biologist, file))).state).toBe('stored');
    await expect(
      awaitImport(await queueImport(biologist, { ...file, label: 'JOB-TWICE-AGAIN' })),
    ).rejects.toMatchObject({ code: 'conflict' });
    expect(await Plate.count({ where: { label: 'JOB-TWICE-AGAIN' } })).toBe(0);
  });

  test('an import no worker takes in time is withdrawn: 503, nothing stored, and a worker starting later stores nothing either', async () => {
    await stopJobWorkers();
    const before = await importRowCounts();
    const jobId = await queueImport(biologist, await request('nav-96-plate-01.xlsx', 'JOB-WITHDRAWN'));
    await expect(awaitImport(jobId, { queuedMs: 300 })).rejects.toMatchObject({
      code: 'unavailable',
      message: /No worker took the import within 0.3 s, so nothing was changed/,
    });
    expect(await uploads()).toBe(0);
    expect(await ComputeJob.findByPk(jobId, { rejectOnEmpty: true })).toMatchObject({
      state: 'failed',
      message: 'No worker took the import within 0.3 s; it was withdrawn and nothing was stored.',
    });
    await startJobWorkers({ sweep: false });
    await sleep(1500); // more than a worker's polling interval
    expect(await importRowCounts()).toEqual(before);
    expect(await ComputeJob.findByPk(jobId, { rejectOnEmpty: true })).toMatchObject({ state: 'failed' });
  });

  test('an upload left by an import job that ended without it is removed by the sweep', async () => {
    await stopJobWorkers();
    const jobId = await queueImport(biologist, await request('nav-96-plate-01.xlsx', 'JOB-LEFT'));
    expect(await sweepJobs()).toMatchObject({ closed: 0 });
    expect(await uploads()).toBe(1); // its job is still open
    await ComputeJob.update({ state: 'failed', message: 'ended elsewhere' }, { where: { id: jobId } });
    await sweepJobs();
    expect(await uploads()).toBe(0);
  });
});

describe('queued jobs wake workers in other processes', () => {
  test('a notice arrives once the enqueueing transaction commits, and again after the listening connection is cut', async () => {
    await stopJobWorkers();
    await resetDatabase();
    const heard: ComputeJobKind[] = [];
    const listener = listenForJobs((kind) => heard.push(kind));
    const listening = async () =>
      (
        await one<{ n: number }>(
          "select count(*)::int as n from pg_stat_activity where application_name = 'gatewell-job-wake' and query ilike 'listen%'",
        )
      ).n === 1;
    try {
      await until(listening);
      const queue = (key: string) =>
        enqueueJob({
          kind: 'plate-fits',
          key,
          data: { plateId: '00000000-0000-4000-8000-000000000000', requestedBy: null },
          requestedBy: null,
        });

      await db().transaction(async (transaction) => {
        const forecast = {
          owner: {
            plateId: null,
            compoundId: '00000000-0000-4000-8000-000000000001',
            screenId: '00000000-0000-4000-8000-000000000002',
          },
          request: { preset: 'hh-squid-1952' as const, block: { gNa: 0.3 } },
        };
        await enqueueJob(
          { kind: 'forecast', key: 'wake-test-a', data: forecast, requestedBy: null },
          transaction,
        );
        await sleep(200);
        expect(heard).toEqual([]); // not before the commit
      });
      await until(() => heard.length === 1);
      expect(heard).toEqual(['forecast']);

      // The database cuts the listener's connection (as a restart does); it reconnects and hears the next job.
      await db().query(
        "select pg_terminate_backend(pid) from pg_stat_activity where application_name = 'gatewell-job-wake'",
      );
      await until(async () => !(await listening()));
      await until(listening);
      await queue('wake-test-b');
      await until(() => heard.length === 2);
      expect(heard).toEqual(['forecast', 'plate-fits']);
    } finally {
      await listener.stop();
      await resetDatabase(); // the jobs queued here have no rows behind them
    }
  });
});
