// The upload storage full: Gatewell keeps uploaded files in PostgreSQL (import_drafts at inspect,
// import_uploads for a queued commit, uploaded_files with the plate), so that is where the disk fills.
// A real full disk is put under those tables (tests/support/full-storage.ts: a tmpfs tablespace taken
// to its last byte), and PostgreSQL meets ENOSPC for real. Each way an upload is written ends with the
// message that the server's upload storage is full (HTTP 507 from every route through errorResponse),
// with nothing written (no draft, plate, wells, readouts, fits, file or audit event), and goes through
// once space is freed.
import { DatabaseError } from 'sequelize';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { errorResponse } from '@/lib/api/handler';
import { isStorageFull, STORAGE_FULL_MESSAGE } from '@/lib/database-unavailable';
import { db } from '@/lib/db';
import { jobQueue } from '@/lib/jobs/queue';
import { startJobWorkers, stopJobWorkers } from '@/lib/jobs/worker';
import { awaitImport, queueImport } from '@/lib/plates/import-jobs';
import { commitImport, inspectUpload, type CommitRequest } from '@/lib/plates/import-service';
import { ComputeJob, ImportDraft, ImportUpload, Plate } from '@/models';
import { importRowCounts } from '../support/import-counts';
import { demoFile, potassiumImportSetup } from '../support/demo-scenario';
import { mountFullStorage, type FullStorage } from '../support/full-storage';
import { fitsCurrent } from '../support/jobs';

const FILE = 'kv-96-plate-01.csv';

/** Everything an upload or an import writes, counted. */
const counts = async () => ({
  imported: await importRowCounts(),
  drafts: await ImportDraft.count(),
  uploads: await ImportUpload.count(),
});

describe('the upload storage is full', () => {
  let storage: FullStorage;
  let biologist: Actor;
  let screenId: string;

  const inspect = () => {
    const { bytes } = demoFile(FILE);
    return inspectUpload(biologist, { screenId, bytes, filename: FILE, mediaType: 'text/csv' });
  };
  const commitRequest = async (): Promise<Extract<CommitRequest, { draftId: string }>> => {
    const inspection = await inspect();
    const sheet = inspection.sheets[0]!;
    return {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
      label: demoFile(FILE).manifest.plate,
    };
  };
  /** The refusal as PostgreSQL raised it, and as every route answers it. */
  const expectStorageFull = async (error: unknown) => {
    expect(error).toBeInstanceOf(DatabaseError);
    expect(error).toMatchObject({
      parent: { code: '53100', message: expect.stringMatching(/No space left on device/) },
    });
    expect(isStorageFull(error)).toBe(true);
    const answer = errorResponse(error);
    expect(answer.status).toBe(507);
    expect(await answer.json()).toEqual({ error: 'storage_full', message: STORAGE_FULL_MESSAGE });
  };

  beforeAll(async () => {
    storage = await mountFullStorage();
    await storage.place(['import_drafts', 'import_uploads', 'uploaded_files']);
  });
  beforeEach(async () => {
    ({ biologist, screenId } = await potassiumImportSetup());
  });
  afterEach(() => storage.free());
  afterAll(async () => {
    await storage.remove();
    await db().close();
  });

  test('inspect: the file is refused with the storage-full message and no draft is kept', async () => {
    storage.fill();
    const before = await counts();
    const failure = await inspect().then(
      () => new Error('the upload was kept although the storage is full'),
      (error: unknown) => error,
    );
    await expectStorageFull(failure);
    expect(await counts()).toEqual(before);

    storage.free();
    expect(await inspect()).toMatchObject({ draftId: expect.any(String) });
    expect(await ImportDraft.count()).toBe(before.drafts + 1);
  });

  test('commit: the plate is refused with nothing of it written, its draft stays, and it commits once space is freed', async () => {
    const request = await commitRequest();
    storage.fill();
    const before = await counts();
    const failure = await commitImport(biologist, request).then(
      () => new Error('the plate was stored although the storage is full'),
      (error: unknown) => error,
    );
    await expectStorageFull(failure);
    expect(await counts()).toEqual(before);
    expect(await ImportDraft.findByPk(request.draftId)).toMatchObject({ consumedAt: null });

    storage.free();
    const { plateId } = await commitImport(biologist, request);
    expect((await Plate.findByPk(plateId))?.label).toBe(request.label);
    await fitsCurrent(plateId);
  });

  test('a queued import: the worker meets the full disk, the person waiting is told so, and nothing is left', async () => {
    const request = await commitRequest();
    storage.fill();
    const before = await counts();
    // Queuing the commit writes its upload row: the full disk refuses that first.
    await expectStorageFull(
      await queueImport(biologist, request).then(
        () => new Error('the import was queued although the storage is full'),
        (error: unknown) => error,
      ),
    );
    expect(await counts()).toEqual(before);

    // With room for the queued commit but none for the stored file, the worker's import meets the full disk.
    // This process's workers are stopped while the commit is queued and the disk filled, then started.
    storage.free();
    await stopJobWorkers();
    await jobQueue();
    const jobId = await queueImport(biologist, request);
    storage.fill();
    expect((await counts()).uploads).toBe(before.uploads + 1);
    await startJobWorkers({ sweep: false });
    const refusal = await awaitImport(jobId, { queuedMs: 30_000, runningMs: 30_000 }).then(
      () => new Error('the import was stored although the storage is full'),
      (error: unknown) => error,
    );
    expect(refusal).toMatchObject({ code: 'storage_full', message: STORAGE_FULL_MESSAGE });
    expect(await counts()).toEqual(before); // the queued upload is removed with the failed job
    expect(await ComputeJob.findByPk(jobId)).toMatchObject({
      state: 'failed',
      message: STORAGE_FULL_MESSAGE,
      attempts: 1,
    });
    expect(await ImportDraft.findByPk(request.draftId)).toMatchObject({ consumedAt: null });
  });
});
