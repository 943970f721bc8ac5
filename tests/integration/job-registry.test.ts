// The job registry on the real database and queue: a payload that does not match its kind's schema is
// refused at enqueue with nothing written; a job whose stored payload fails the schema ends as refused
// (not retried, the worker goes on); each queue keeps the pg-boss options it had before the registry.
import { setTimeout as sleep } from 'node:timers/promises';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { JobPayloadError } from '@/lib/jobs/kinds';
import { waitForJob } from '@/lib/jobs/progress';
import { enqueueJob, jobQueue } from '@/lib/jobs/queue';
import { stopJobWorkers } from '@/lib/jobs/worker';
import { ComputeJob } from '@/models';
import { resetDatabase } from '../support/database';

const count = async (sql: string) =>
  (await db().query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0]!.n;
const written = async () => ({
  rows: await count('select count(*)::int as n from compute_jobs'),
  jobs: await count('select count(*)::int as n from pgboss.job'),
  uploads: await count('select count(*)::int as n from import_uploads'),
});

afterAll(async () => {
  await stopJobWorkers();
  await db().close();
});

describe('job payloads are checked against their kind', () => {
  beforeEach(async () => {
    await jobQueue();
    await resetDatabase();
  });

  test.each([
    ['plate-fits', { plateId: 'plate 7', requestedBy: null }, 'plateId: plateId must be an id (UUID)'],
    ['plate-fits', { plateId: '00000000-0000-4000-8000-000000000001' }, 'requestedBy: '],
    [
      'plate-forecasts',
      {
        plateId: '00000000-0000-4000-8000-000000000001',
        at: -1,
        requestedBy: '00000000-0000-4000-8000-000000000002',
      },
      'at: at must be 0 or more',
    ],
    ['plate-import', { uploadId: '00000000-0000-4000-8000-000000000001', extra: true }, '(payload): '],
    [
      'forecast',
      {
        owner: {
          plateId: null,
          compoundId: '00000000-0000-4000-8000-000000000001',
          screenId: '00000000-0000-4000-8000-000000000002',
        },
        request: { preset: 'no-such-cell' },
      },
      'request.preset: preset must be one of',
    ],
  ] as const)('a %s payload %j is refused at enqueue and nothing is written', async (kind, data, problem) => {
    const before = await written();
    // The payload is wrong on purpose: what a caller typed wrongly, or built from bad data, must not reach the queue.
    const refused = await enqueueJob({
      kind,
      key: `bad-${kind}`,
      data: data as never,
      requestedBy: null,
    }).catch((error: unknown) => error);
    expect(refused).toBeInstanceOf(JobPayloadError);
    expect((refused as Error).message).toContain(`The payload of a ${kind} job is not valid: `);
    expect((refused as Error).message).toContain(problem);
    expect(await written()).toEqual(before);
  });

  test('a refused payload inside the caller’s transaction writes nothing there either', async () => {
    const before = await written();
    await expect(
      db().transaction(async (transaction) => {
        await enqueueJob(
          {
            kind: 'plate-fits',
            key: 'ok-first',
            data: { plateId: '00000000-0000-4000-8000-000000000001', requestedBy: null },
            requestedBy: null,
          },
          transaction,
        );
        await enqueueJob(
          {
            kind: 'plate-fits',
            key: 'bad-second',
            data: { plateId: 'nope', requestedBy: null },
            requestedBy: null,
          },
          transaction,
        );
      }),
    ).rejects.toBeInstanceOf(JobPayloadError);
    expect(await written()).toEqual(before);
  });

  test('a stored job whose payload fails its schema ends refused, is not retried, and the worker goes on', async () => {
    // The workers of this file (tests/support/job-workers.ts) take jobs from every queue.
    const boss = await jobQueue();
    // Written past enqueueJob, as a job stored by another version or changed by hand would be.
    const badId = (await boss.send('gatewell-plate-fits', { plateId: 42, requestedBy: null }))!;
    await ComputeJob.create({
      id: badId,
      kind: 'plate-fits',
      jobKey: 'stored-bad',
      plateId: null,
      compoundId: null,
      requestedBy: null,
    });
    const bad = await waitForJob(badId, 20_000);
    expect(bad).toMatchObject({ state: 'failed', attempts: 1 });
    expect(bad.message).toBe(
      "The job's payload is not valid, so it was not run: plateId: plateId must be an id (UUID).",
    );
    const row = await ComputeJob.findByPk(badId, { rejectOnEmpty: true });
    expect(row.outcome).toMatchObject({
      code: 'invalid',
      details: { issues: [expect.objectContaining({ path: ['plateId'] })] },
    });
    // The kind allows three retries; a refusal takes none of them.
    await sleep(2500);
    expect(await ComputeJob.findByPk(badId, { rejectOnEmpty: true })).toMatchObject({
      state: 'failed',
      attempts: 1,
    });
    expect(
      await count(`select count(*)::int as n from pgboss.job where id = '${badId}' and retry_count > 0`),
    ).toBe(0);

    // The same worker then runs a good job of that kind (for a plate that does not exist: nothing to do).
    const good = await enqueueJob({
      kind: 'plate-fits',
      key: 'after-bad',
      data: { plateId: '00000000-0000-4000-8000-0000000000aa', requestedBy: null },
      requestedBy: null,
    });
    expect(await waitForJob(good.id, 20_000)).toMatchObject({
      state: 'done',
      message: 'Nothing to do: the plate no longer exists.',
    });
  });
});

describe('retry policies live in the registry', () => {
  // The pg-boss options each queue had before they moved into lib/jobs/kinds.ts (git history of lib/jobs/queue.ts).
  test.each([
    [
      'gatewell-plate-fits',
      { policy: 'short', retryLimit: 3, retryDelay: 2, retryBackoff: true, expireInSeconds: 120 },
    ],
    ['gatewell-forecast', { policy: 'short', retryLimit: 2, retryDelay: 2, expireInSeconds: 300 }],
    ['gatewell-plate-forecasts', { policy: 'short', retryLimit: 1, retryDelay: 5, expireInSeconds: 3600 }],
    ['gatewell-plate-import', { policy: 'standard', retryLimit: 0, expireInSeconds: 120 }],
  ])('%s keeps its options', async (name, options) => {
    const queue = await (await jobQueue()).getQueue(name);
    expect(queue).toMatchObject(options);
  });
});
