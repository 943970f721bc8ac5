// Import drafts on the real database and queue (issue 17): inspect reads and parses the file once and
// keeps it as its owner's draft; preview, commit and the import job take the draft's sheets and never
// parse again; only the owner may use a draft; an expired or used one is refused by name; the commit
// consumes the draft in the plate's own transaction; the sweep removes expired drafts.
// The parses are counted by the parse worker threads the process starts (parseWorkerStarts).
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { parseWorkerStarts } from '@/lib/imports/parse-spreadsheet';
import { startJobWorkers, stopJobWorkers, sweepJobs } from '@/lib/jobs/worker';
import { awaitImport, queueImport } from '@/lib/plates/import-jobs';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { Plate, UploadedFile } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { demoFile, makeDemoScreens } from '../support/demo-scenario';
import { importRowCounts } from '../support/import-counts';
import { holdLocks } from '../support/lock-holder';

const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const one = async <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  (await db().query<T>(sql, { type: QueryTypes.SELECT, replacements }))[0];
const count = async (table: 'import_drafts' | 'import_uploads') =>
  (await one<{ n: number }>(`select count(*)::int as n from ${table}`))!.n;

afterAll(async () => {
  await stopJobWorkers();
  await db().close();
});

describe('import drafts', () => {
  let biologist: Actor;
  let screens: Record<string, string>;

  beforeEach(async () => {
    await startJobWorkers({ sweep: false });
    await resetDatabase();
    screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
  });

  /** Inspects a demo export as `actor`; returns the upload, the draft id and the data sheet's choice with a label. */
  async function inspectDemo(actor: Actor, name: string, label: string) {
    const { bytes, manifest } = demoFile(name);
    const upload = {
      screenId: screens[manifest.target]!,
      bytes,
      filename: name,
      mediaType: name.endsWith('.csv') ? 'text/csv' : XLSX,
    };
    const inspection = await inspectUpload(actor, upload);
    const sheet = inspection.sheets.find((s) => s.name === manifest.dataSheet)!;
    if (!inspection.draftId) throw new Error(`inspect kept no draft of ${name}`);
    return {
      upload,
      draftId: inspection.draftId,
      choice: { sheet: sheet.name, mapping: sheet.guess.mapping, label },
    };
  }

  test('inspect → preview → commit through the import job reads and parses the file once, and stores the original bytes', async () => {
    const starts = parseWorkerStarts();
    const { upload, draftId, choice } = await inspectDemo(biologist, 'nav-96-plate-01.xlsx', 'DRAFT-P01');
    expect(parseWorkerStarts() - starts).toBe(1);

    const draft = await one<Record<string, unknown>>(
      `select owner_id, screen_id, filename, media_type, sha256, size_bytes, jsonb_typeof(sheets) as sheets, octet_length(bytes) as bytes,
              extract(epoch from expires_at - created_at)::int as lifetime_s, consumed_at
         from import_drafts where id = :draftId`,
      { draftId },
    );
    expect(draft).toEqual({
      owner_id: biologist.id,
      screen_id: upload.screenId,
      filename: 'nav-96-plate-01.xlsx',
      media_type: XLSX,
      sha256: createHash('sha256').update(upload.bytes).digest('hex'),
      size_bytes: upload.bytes.byteLength,
      sheets: 'array',
      bytes: upload.bytes.byteLength,
      lifetime_s: 24 * 3600,
      consumed_at: null,
    });

    const preview = await previewImport(biologist, { draftId, ...choice });
    expect(preview.ok).toBe(true);
    const result = await awaitImport(await queueImport(biologist, { draftId, ...choice }));
    expect(result.state).toBe('stored');
    expect(parseWorkerStarts() - starts).toBe(1);

    const plate = await Plate.findOne({ where: { label: 'DRAFT-P01' }, rejectOnEmpty: true });
    const file = await UploadedFile.findByPk(plate.uploadedFileId, { rejectOnEmpty: true });
    expect(Buffer.compare(file.content, Buffer.from(upload.bytes))).toBe(0);
    expect(file).toMatchObject({
      filename: 'nav-96-plate-01.xlsx',
      mediaType: XLSX,
      sizeBytes: upload.bytes.byteLength,
    });

    // Consumed by the plate's own transaction (the row's xmin is that of the import's audit event), its sheets and bytes dropped.
    const consumed = await one<Record<string, unknown>>(
      `select d.plate_id, d.sheets is null as no_sheets, d.bytes is null as no_bytes, d.consumed_at is not null as consumed,
              d.xmin::text = (select xmin::text from audit_events where action = 'import' and entity_id = :plateId) as same_transaction
         from import_drafts d where d.id = :draftId`,
      { draftId, plateId: plate.id },
    );
    expect(consumed).toEqual({
      plate_id: plate.id,
      no_sheets: true,
      no_bytes: true,
      consumed: true,
      same_transaction: true,
    });
    expect(await count('import_uploads')).toBe(0);
  });

  test('a commit that sends the file itself reads it once, in its job', async () => {
    const { upload, choice } = await inspectDemo(biologist, 'kv-96-plate-01.csv', 'FILE-P01');
    const starts = parseWorkerStarts();
    const result = await awaitImport(await queueImport(biologist, { ...upload, ...choice }));
    expect(result.state).toBe('stored');
    expect(parseWorkerStarts() - starts).toBe(1);
  });

  test('only its owner may use a draft: another biologist gets not found from preview and commit, and nothing is written', async () => {
    const { draftId, choice } = await inspectDemo(biologist, 'nav-96-plate-01.xlsx', 'OWNER-P01');
    const other = await makeActor(['biologist']);
    const before = await importRowCounts();
    const notFound = { code: 'not_found', message: 'No such import draft: read the file again.' };
    await expect(previewImport(other, { draftId, ...choice })).rejects.toMatchObject(notFound);
    await expect(queueImport(other, { draftId, ...choice })).rejects.toMatchObject(notFound);
    await expect(commitImport(other, { draftId, ...choice })).rejects.toMatchObject(notFound);
    await expect(
      previewImport(other, { draftId: '00000000-0000-4000-8000-000000000000', ...choice }),
    ).rejects.toMatchObject(notFound);
    await expect(previewImport(await makeActor(['chemist']), { draftId, ...choice })).rejects.toMatchObject({
      code: 'forbidden',
    });
    expect(await importRowCounts()).toEqual(before);
    expect(await count('import_uploads')).toBe(0);
    expect(await one('select consumed_at from import_drafts where id = :draftId', { draftId })).toEqual({
      consumed_at: null,
    });

    // The owner's commit goes through.
    expect((await commitImport(biologist, { draftId, ...choice })).plateId).toEqual(expect.any(String));
  });

  test('an expired draft is refused with a clear message, and the sweep removes it while a fresh draft stays', async () => {
    const expired = await inspectDemo(biologist, 'nav-96-plate-01.xlsx', 'EXPIRED-P01');
    const fresh = await inspectDemo(biologist, 'kv-96-plate-01.csv', 'FRESH-P01');
    await db().query(
      "update import_drafts set created_at = now() - interval '25 hours', expires_at = now() - interval '1 hour' where id = :id",
      { replacements: { id: expired.draftId } },
    );
    const before = await importRowCounts();
    const refusal = {
      code: 'conflict',
      message: expect.stringMatching(
        /^This import draft expired at \S+ \(drafts are kept 24 hours\); read the file again\.$/,
      ),
      details: { draft: 'expired' },
    };
    await expect(
      previewImport(biologist, { draftId: expired.draftId, ...expired.choice }),
    ).rejects.toMatchObject(refusal);
    await expect(
      queueImport(biologist, { draftId: expired.draftId, ...expired.choice }),
    ).rejects.toMatchObject(refusal);
    await expect(
      commitImport(biologist, { draftId: expired.draftId, ...expired.choice }),
    ).rejects.toMatchObject(refusal);
    expect(await importRowCounts()).toEqual(before);

    expect(await count('import_drafts')).toBe(2);
    await sweepJobs();
    expect(await count('import_drafts')).toBe(1);
    await expect(
      previewImport(biologist, { draftId: expired.draftId, ...expired.choice }),
    ).rejects.toMatchObject({ code: 'not_found' });
    expect((await previewImport(biologist, { draftId: fresh.draftId, ...fresh.choice })).ok).toBe(true);
  });

  // The race is forced: a transaction of the test holds the draft's row, both commits start (each in its own
  // transaction, as two import jobs run them) and PostgreSQL shows both waiting for that row; only then is
  // it let go. Without the draft's row lock (lib/plates/import-drafts.ts) they would not wait, and both would
  // read the draft unused and store two plates.
  test('a used draft cannot be committed twice: of two racing commits one stores the plate, the other is refused as used', async () => {
    const { draftId, choice } = await inspectDemo(biologist, 'nav-96-plate-01.xlsx', 'RACE-A');
    const holder = await holdLocks([
      { sql: 'select id from import_drafts where id = $1 for update', params: [draftId] },
    ]);
    let outcomes: PromiseSettledResult<{ plateId: string }>[];
    try {
      const racing = Promise.allSettled([
        db().transaction((transaction) => commitImport(biologist, { draftId, ...choice }, { transaction })),
        db().transaction((transaction) =>
          commitImport(biologist, { draftId, ...choice, label: 'RACE-B' }, { transaction }),
        ),
      ]);
      const waiters = await holder.waiters(2);
      // The first waits for the holder's transaction, the second for the row lock the first queued for.
      const first = waiters.find((w) => w.blockedBy.includes(holder.pid))!;
      expect(first.blockedBy).toEqual([holder.pid]);
      const second = waiters.find((w) => w !== first)!;
      expect([[holder.pid], [first.pid]]).toContainEqual(second.blockedBy);
      await holder.release();
      outcomes = await racing;
    } finally {
      await holder.release();
    }
    const stored = outcomes.filter((o) => o.status === 'fulfilled');
    const refused = outcomes.filter((o) => o.status === 'rejected');
    expect(stored).toHaveLength(1);
    expect(refused).toHaveLength(1);
    const plateId = (stored[0] as PromiseFulfilledResult<{ plateId: string }>).value.plateId;
    const used = {
      code: 'conflict',
      message:
        'This file was already stored as a plate from this draft; read the file again to import it anew.',
      details: { draft: 'used', plateId },
    };
    expect((refused[0] as PromiseRejectedResult).reason).toMatchObject(used);
    expect(await Plate.count({ where: { label: ['RACE-A', 'RACE-B'] } })).toBe(1);

    // Later attempts are refused the same way: at once when queued, and by preview.
    await expect(queueImport(biologist, { draftId, ...choice, label: 'RACE-C' })).rejects.toMatchObject(used);
    await expect(previewImport(biologist, { draftId, ...choice })).rejects.toMatchObject(used);
    expect(await count('import_uploads')).toBe(0);
  });

  test('a commit queued twice before either ran: the job that comes second is refused as used', async () => {
    const { draftId, choice } = await inspectDemo(biologist, 'kv-96-plate-01.csv', 'QUEUED-A');
    await stopJobWorkers();
    const first = await queueImport(biologist, { draftId, ...choice });
    const second = await queueImport(biologist, { draftId, ...choice, label: 'QUEUED-B' });
    await startJobWorkers({ sweep: false });
    expect(await awaitImport(first)).toMatchObject({ state: 'stored' });
    await expect(awaitImport(second)).rejects.toMatchObject({ code: 'conflict', details: { draft: 'used' } });
    expect(await Plate.count({ where: { label: 'QUEUED-B' } })).toBe(0);
    expect(await count('import_uploads')).toBe(0);
  });
});
