import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { isDatabaseUnavailable } from '@/lib/database-unavailable';
import { db } from '@/lib/db';
import { commitImport, inspectUpload, type CommitRequest } from '@/lib/plates/import-service';
import { MailMessage, Plate, UploadedFile } from '@/models';
import { importRowCounts } from '../support/import-counts';
import { demoFile, potassiumImportSetup } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';
import { outsideClient, pollFor, testCluster } from '../support/test-cluster';

// The test cluster is restarted (scripts/pg.sh restart) while an import's transaction is open, with
// Gatewell's own import service and pool on the real database. An outside connection holds the audit
// trail so that the import waits, mid-transaction, on its audit event: by then it has written the
// file, plate, wells, readouts and fits, none of them committed.
const FILE = 'kv-96-plate-01.csv';

/** The commit of the file's import draft: a failed commit leaves the draft unused, so the same request goes through afterwards. */
async function commitRequest(biologist: Actor, screenId: string): Promise<CommitRequest> {
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

describe('a database restart during an import', () => {
  let biologist: Actor;
  let screenId: string;
  beforeEach(async () => {
    ({ biologist, screenId } = await potassiumImportSetup());
  });
  afterAll(() => db().close());

  test.each(['immediate', 'fast'] as const)(
    '%s restart: the import fails clearly, leaves no row behind, and the same file imports afterwards',
    async (mode) => {
      const request = await commitRequest(biologist, screenId);
      const before = await importRowCounts();
      // The app's role may not lock the append-only audit trail in SHARE mode; its owner may.
      const holder = await outsideClient('owner');
      await holder.query('begin');
      await holder.query('lock table audit_events in share mode');
      const holderPid = (await holder.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!.pid;

      let outcome: unknown;
      const importing = commitImport(biologist, request).then(
        () => (outcome = new Error('the import committed although the database restarted under it')),
        (error: unknown) => (outcome = error),
      );

      // The import's own backend: in a transaction that has written rows (it holds a transaction id), waiting on the held lock.
      const watcher = await outsideClient();
      const backend = await pollFor(async () => {
        if (outcome)
          throw new Error(
            `the import ended before it was seen waiting in its transaction: ${String(outcome)}`,
          );
        const { rows } = await watcher.query<{ pid: number; xid: string | null; waiting: string | null }>(
          `select pid, backend_xid::text as xid, wait_event_type as waiting from pg_stat_activity
          where datname = current_database() and xact_start is not null and $1 = any(pg_blocking_pids(pid))`,
          [holderPid],
        );
        return rows[0];
      }, 'no import transaction waited on the held audit trail');
      expect(backend).toMatchObject({ waiting: 'Lock', xid: expect.stringMatching(/^\d+$/) });
      await watcher.end();

      await testCluster('restart', mode);
      const failure = await importing;
      await holder.end().catch(() => undefined);

      // The lost connection as the database and pg report it: the shutdown notice, the ended connection, or a broken client refused.
      expect(failure).toMatchObject({
        name: 'SequelizeDatabaseError',
        message: expect.stringMatching(
          /^(terminating connection due to administrator command|Connection terminated unexpectedly|Client has encountered a connection error and is not queryable)$/,
        ),
      });
      expect(isDatabaseUnavailable(failure)).toBe(true); // so routes answer 503 "cannot reach its database … nothing was changed"

      // Nothing of that import is left: no plate, wells, readouts, fits, file, template, audit event or notice.
      expect(await importRowCounts()).toEqual(before);
      expect(await UploadedFile.count({ where: { filename: FILE } })).toBe(0);
      expect(await MailMessage.count()).toBe(0);

      // The same process, with the same pool, imports the same file.
      const { plateId } = await commitImport(biologist, request);
      expect((await Plate.findByPk(plateId))?.label).toBe(request.label);
      expect(await UploadedFile.count({ where: { filename: FILE } })).toBe(1);
      expect(await MailMessage.count({ where: { plateId } })).toBeGreaterThan(0);
      // Its refit writes an audit event too: let it finish, so that the next case's held lock waits for that case's import alone.
      await fitsCurrent(plateId);
    },
  );

  test('with the database stopped the import is refused as unavailable, and after the start it goes through', async () => {
    const request = await commitRequest(biologist, screenId);
    const before = await importRowCounts();
    await testCluster('stop');
    let failure: unknown;
    try {
      failure = await commitImport(biologist, request).then(
        () => new Error('the import succeeded with the database stopped'),
        (error: unknown) => error,
      );
    } finally {
      await testCluster('start');
    }
    expect(failure).toMatchObject({ name: 'SequelizeConnectionRefusedError' });
    expect(isDatabaseUnavailable(failure)).toBe(true);
    expect(await importRowCounts()).toEqual(before);
    const { plateId } = await commitImport(biologist, request);
    expect((await Plate.findByPk(plateId))?.label).toBe(request.label);
    await fitsCurrent(plateId);
  });
});
