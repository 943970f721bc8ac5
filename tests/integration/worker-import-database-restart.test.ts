// The database restarted while a job worker process (scripts/worker.ts) stores an import. The web side
// has kept the upload and queued its plate-import job (queueImport); the worker has taken it and is
// inside the import's transaction for certain: a session of the test holds the append-only audit trail,
// and PostgreSQL shows the worker's session waiting on it with rows written (a transaction id). Then the
// cluster restarts. The worker must see the database come back and store the plate from the same
// upload, once: the request waiting on the job gets the plate, nothing of the lost attempt is left, and
// the worker neither dies nor leaves an unhandled rejection behind.
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, afterEach, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { jobQueue } from '@/lib/jobs/queue';
import { stopJobWorkers } from '@/lib/jobs/worker';
import { awaitImport, queueImport } from '@/lib/plates/import-jobs';
import { inspectUpload, type CommitRequest } from '@/lib/plates/import-service';
import { ComputeJob, ImportUpload, Plate, UploadedFile } from '@/models';
import { importRowCounts } from '../support/import-counts';
import { demoFile, potassiumImportSetup } from '../support/demo-scenario';
import { outsideClient, pollFor, testCluster } from '../support/test-cluster';

const FILE = 'kv-96-plate-01.csv';

/** A worker process as an operator starts one, taking imports only. */
function startImportWorker(output: string[]): ChildProcess {
  const child = spawn(
    process.execPath,
    [
      '--conditions=react-server',
      '--import',
      'tsx',
      'scripts/worker.ts',
      '--fits',
      '0',
      '--forecasts',
      '0',
      '--imports',
      '1',
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

const alive = (child: ChildProcess) => child.exitCode === null && child.signalCode === null;

async function draftCommit(biologist: Actor, screenId: string): Promise<CommitRequest> {
  const { bytes, manifest } = demoFile(FILE);
  const inspection = await inspectUpload(biologist, {
    screenId,
    bytes,
    filename: FILE,
    mediaType: 'text/csv',
  });
  const sheet = inspection.sheets.find((s) => s.name === manifest.dataSheet)!;
  return {
    draftId: inspection.draftId!,
    sheet: sheet.name,
    mapping: sheet.guess.mapping,
    label: manifest.plate,
  };
}

describe('a database restart while a worker stores an import', () => {
  let biologist: Actor;
  let screenId: string;
  let worker: ChildProcess | null = null;
  const output: string[] = [];

  beforeEach(async () => {
    // Only the worker process of the test takes import jobs; this process queues them.
    await stopJobWorkers();
    await jobQueue();
    ({ biologist, screenId } = await potassiumImportSetup());
    output.length = 0;
  });
  afterEach(async () => {
    if (worker && alive(worker)) {
      const exit = new Promise((resolve) => worker!.once('exit', resolve));
      worker.kill('SIGTERM');
      await exit;
    }
    worker = null;
  });
  afterAll(async () => {
    await stopJobWorkers();
    await db().close();
  });

  test(
    'the worker stores the plate once the database is back; the waiting request gets it',
    { timeout: 180_000 },
    async () => {
      const request = await draftCommit(biologist, screenId);
      const before = await importRowCounts();
      worker = startImportWorker(output);
      await pollFor(
        async () => (output.join('').includes('taking jobs') ? true : undefined),
        'the worker did not start taking jobs',
        60_000,
      );

      // The app's role may not lock the append-only audit trail in SHARE mode; its owner may.
      const holder = await outsideClient('owner');
      await holder.query('begin');
      await holder.query('lock table audit_events in share mode');
      const holderPid = (await holder.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!.pid;

      const jobId = await queueImport(biologist, request);
      const waiting = awaitImport(jobId, { queuedMs: 60_000, runningMs: 90_000 });

      // The worker's session: inside the import's transaction, rows written, waiting on the held trail.
      const watcher = await outsideClient();
      const backend = await pollFor(async () => {
        const { rows } = await watcher.query<{ app: string; xid: string | null; waiting: string | null }>(
          `select application_name as app, backend_xid::text as xid, wait_event_type as waiting from pg_stat_activity
          where datname = current_database() and xact_start is not null and $1 = any(pg_blocking_pids(pid))`,
          [holderPid],
        );
        return rows[0];
      }, 'no worker session waited on the held audit trail');
      expect(backend).toMatchObject({ waiting: 'Lock', xid: expect.stringMatching(/^\d+$/) });
      await watcher.end();

      await testCluster('restart', 'immediate');
      await holder.end().catch(() => undefined);

      const result = await waiting;
      expect(result.state).toBe('stored');
      const plateId = result.state === 'stored' ? result.plateId : '';
      expect((await Plate.findByPk(plateId))?.label).toBe(request.label);

      // One plate from the one upload: the lost attempt left nothing, the second attempt everything.
      const after = await importRowCounts();
      expect(after[0]).toBe(before[0]! + 1); // plates
      expect(after[4]).toBe(before[4]! + 1); // uploaded files
      expect(after[6]).toBe(before[6]! + 1); // import audit events
      expect(await UploadedFile.count({ where: { filename: FILE } })).toBe(1);
      expect(await ImportUpload.count()).toBe(0);
      const job = await ComputeJob.findByPk(jobId, { rejectOnEmpty: true });
      expect(job).toMatchObject({ state: 'done', plateId });
      expect(job.message).toMatch(/database went away .* stored on the next attempt/i);

      // The worker lives on, and said nothing of an unhandled rejection.
      expect(alive(worker)).toBe(true);
      expect(output.join('')).not.toMatch(/unhandled|UnhandledPromiseRejection/i);
    },
  );
});
