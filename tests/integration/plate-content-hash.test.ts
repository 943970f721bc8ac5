import pg from 'pg';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { contentSha256 } from '@/lib/auth/canonical-json';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { setWellExclusion } from '@/lib/plates/review';
import { plateContent, plateContentSha256 } from '@/lib/signoff/plate-content';
import { CONTENT_SQL } from '@/lib/signoff/queries';
import { asSchemaOwner, resetDatabase } from '../support/database';
import { fitsCurrent } from '../support/jobs';
import { signoffCast } from '../support/signoff-scenario';

// The history tab shows the plate's data hash from a cache that holds while the plate's content revision
// stays the same (lib/signoff/plate-content.ts); triggers draw a new revision with every change to the
// signed content (migrations/20261211001000-plate-content-revisions.js). Every check here compares the
// cached answer with the hash worked out afresh from the data, after a change made straight in SQL,
// behind Gatewell's back, or through one of Gatewell's write paths.
describe('the plate data hash the history tab shows', () => {
  let plateId: string;
  let biologist: Actor;
  const sql = (text: string) => db().query(text, { replacements: { plateId } });
  const fresh = async () => contentSha256(await plateContent(plateId));
  /** Each table's relfrozenxid, which a VACUUM (FREEZE) that runs moves on to its transaction horizon. */
  const frozenXids = async () =>
    Object.fromEntries(
      (
        await db().query<{ table: string; xid: string }>(
          `select relname as "table", relfrozenxid::text as xid from pg_class where relname in ('readouts', 'wells', 'fits') and relnamespace = 'public'::regnamespace`,
          { type: QueryTypes.SELECT },
        )
      ).map((r) => [r.table, Number(r.xid)]),
    );

  beforeAll(async () => {
    await resetDatabase();
    ({ plateId, biologist } = await signoffCast());
  });
  afterAll(() => db().close());

  test('is the hash of the data as it stands, asked once or again', async () => {
    const first = await plateContentSha256(plateId);
    expect(first).toBe(await fresh());
    expect(await plateContentSha256(plateId)).toBe(first);
  });

  test('views arriving together after a change each get the hash of the changed data', async () => {
    const before = await plateContentSha256(plateId);
    await db().query(
      `update readouts set control_current_pa = control_current_pa + 2 where id = (select r.id from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by r.id limit 1)`,
      { replacements: { plateId } },
    );
    const together = await Promise.all(Array.from({ length: 5 }, () => plateContentSha256(plateId)));
    const expected = await fresh();
    expect(expected).not.toBe(before);
    expect(together).toEqual(Array.from({ length: 5 }, () => expected));
  });

  test.each([
    [
      'a readout current',
      `update readouts set control_current_pa = control_current_pa + 1 where id = (select r.id from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by r.id limit 1)`,
    ],
    [
      'a well exclusion',
      `update wells set excluded = true, exclusion_reason = 'edited in SQL' where id = (select id from wells where plate_id = :plateId order by id limit 1)`,
    ],
    [
      'a fit IC50',
      `update fits set ic50_um = coalesce(ic50_um, 1) * 2 where id = (select id from fits where plate_id = :plateId order by id limit 1)`,
    ],
    [
      'a removed fit',
      `delete from fits where id = (select id from fits where plate_id = :plateId order by id desc limit 1)`,
    ],
    [
      'a compound identifier',
      `update compounds set identifier = identifier || '-renamed' where id = (select compound_id from wells where plate_id = :plateId and compound_id is not null limit 1)`,
    ],
    [
      'the source file name',
      `update uploaded_files set filename = 'renamed.xlsx' where id = (select uploaded_file_id from plates where id = :plateId)`,
    ],
    ['the plate label', `update plates set label = label || '-edited' where id = :plateId`],
    [
      'the plate QC summary',
      `update plates set qc_summary = qc_summary || '[{"edited": true}]'::jsonb where id = :plateId`,
    ],
    [
      'the source file hash',
      `update uploaded_files set sha256 = md5(sha256) || md5(sha256) where id = (select uploaded_file_id from plates where id = :plateId)`,
    ],
    [
      'a well concentration',
      `update wells set concentration_um = concentration_um * 10 where id = (select id from wells where plate_id = :plateId and concentration_um is not null order by id limit 1)`,
    ],
    [
      'a removed readout',
      `delete from readouts where id = (select r.id from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by r.id desc limit 1)`,
    ],
    [
      'an added fit',
      `insert into fits (plate_id, compound_id, target_id, status, message, n)
         select :plateId, c.id, (select target_id from fits where plate_id = :plateId limit 1), 'insufficient', 'added in SQL', 0
           from compounds c where not exists (select 1 from fits f where f.plate_id = :plateId and f.compound_id = c.id) limit 1`,
    ],
  ])('follows %s changed in SQL', async (_what, change) => {
    const before = await plateContentSha256(plateId);
    await sql(change);
    const after = await plateContentSha256(plateId);
    expect(after).not.toBe(before);
    expect(after).toBe(await fresh());
  });

  test('follows a well excluded through the review service', async () => {
    const before = await plateContentSha256(plateId);
    const [well] = await db().query<{ id: string }>(
      `select id from wells where plate_id = :plateId and not excluded order by id limit 1`,
      { type: QueryTypes.SELECT, replacements: { plateId } },
    );
    await setWellExclusion(biologist, plateId, {
      wellIds: [well!.id],
      excluded: true,
      reason: 'bubble in the well',
    });
    const after = await plateContentSha256(plateId);
    expect(after).not.toBe(before);
    expect(after).toBe(await fresh());
  });

  // Under the plate's row lock, which the refit job queued by the exclusion above also takes, so that no
  // fit it writes draws a revision between the reads.
  test('a workflow change (state, version) keeps the revision; a content change draws a new one', async () => {
    await db().transaction(async (transaction) => {
      const inTx = (text: string) => db().query(text, { replacements: { plateId }, transaction });
      const revision = async () =>
        (
          (await inTx(
            `select revision::text as r from plate_content_revisions where plate_id = :plateId`,
          )) as [{ r: string }[], unknown]
        )[0][0]!.r;
      await inTx(`select id from plates where id = :plateId for update`);
      const before = await revision();
      await inTx(`update plates set version = version + 1 where id = :plateId`);
      expect(await revision()).toBe(before);
      await inTx(`update plates set label = label || '+' where id = :plateId`);
      expect(await revision()).not.toBe(before);
    });
  });

  test("the app's role may read the revisions but not set one", async () => {
    await expect(
      sql(`update plate_content_revisions set revision = revision - 1 where plate_id = :plateId`),
    ).rejects.toThrow('permission denied for table plate_content_revisions');
    await expect(sql(`delete from plate_content_revisions where plate_id = :plateId`)).rejects.toThrow(
      'permission denied for table plate_content_revisions',
    );
    await expect(sql(`alter table wells disable trigger wells_content_revision_upd`)).rejects.toThrow(
      'must be owner of table wells',
    );
  });

  // A table the signed content starts to read without the triggers would let a cached hash outlive a
  // change: every table in PostgreSQL's plans of the content's statements must have them.
  test('every table the signed content reads draws a new revision when its rows change', async () => {
    const read = new Set<string>();
    const walk = (node: Record<string, unknown>) => {
      if (typeof node['Relation Name'] === 'string') read.add(node['Relation Name']);
      for (const child of (node.Plans as Record<string, unknown>[] | undefined) ?? []) walk(child);
    };
    for (const text of Object.values(CONTENT_SQL)) {
      const [row] = await db().query<{ 'QUERY PLAN': { Plan: Record<string, unknown> }[] }>(
        `explain (format json) ${text}`,
        { type: QueryTypes.SELECT, replacements: { plateId } },
      );
      walk(row!['QUERY PLAN'][0]!.Plan);
    }
    expect([...read].sort()).toEqual(['compounds', 'fits', 'plates', 'readouts', 'uploaded_files', 'wells']);
    const triggers = await db().query<{ table: string; events: string[] }>(
      `select c.relname as table, array_agg(t.tgname::text order by t.tgname) as events
         from pg_trigger t join pg_class c on c.oid = t.tgrelid
        where t.tgname like '%\_content\_revision\_%' and t.tgenabled = 'O' and c.relname in (:tables)
        group by c.relname`,
      { type: QueryTypes.SELECT, replacements: { tables: [...read] } },
    );
    const byTable = Object.fromEntries(triggers.map((t) => [t.table, t.events]));
    const all = (table: string, ops: string[]) => ops.map((op) => `${table}_content_revision_${op}`);
    expect(byTable).toEqual({
      // A new compound is on no plate yet, and a compound a plate uses cannot be deleted (wells' foreign key).
      compounds: all('compounds', ['trunc', 'upd']),
      fits: all('fits', ['del', 'ins', 'trunc', 'upd']),
      // Deleting a plate deletes its revision.
      plates: all('plates', ['ins', 'trunc', 'upd']),
      readouts: all('readouts', ['del', 'ins', 'trunc', 'upd']),
      uploaded_files: all('uploaded_files', ['del', 'ins', 'trunc', 'upd']),
      wells: all('wells', ['del', 'ins', 'trunc', 'upd']),
    });
  });

  // The app's role owns no table (migrations/20261205000100-app-role-privileges.js), so PostgreSQL 15 skips
  // each table of its VACUUM with a warning and freezes nothing: this fails if the app's role owned a table
  // or the database. Freezing is then done as the schema's owner, and the hash must not move.
  test('stays the same when rows are rewritten with the same values or frozen by VACUUM', async () => {
    // The refit queued by the exclusion above rewrites the fits: let it end, so that only this test changes rows.
    await fitsCurrent(plateId);
    const before = await plateContentSha256(plateId);
    await sql(
      `update readouts set qc_reasons = qc_reasons where well_id in (select id from wells where plate_id = :plateId)`,
    );
    expect(await plateContentSha256(plateId)).toBe(before);

    const frozenAtStart = await frozenXids();
    const app = new pg.Client({ connectionString: process.env.DATABASE_URL });
    const notices: { severity?: string; message: string }[] = [];
    app.on('notice', (notice) => notices.push({ severity: notice.severity, message: notice.message ?? '' }));
    await app.connect();
    try {
      await app.query('vacuum (freeze) readouts, wells, fits');
    } finally {
      await app.end();
    }
    expect(notices).toEqual(
      ['readouts', 'wells', 'fits'].map((table) => ({
        severity: 'WARNING',
        message: `skipping "${table}" --- only table or database owner can vacuum it`,
      })),
    );

    // A VACUUM (FREEZE) that ran moves each table's relfrozenxid on; the skipped one left them where they were.
    expect(await frozenXids()).toEqual(frozenAtStart);
    await asSchemaOwner((owner) => owner.query('vacuum (freeze) readouts, wells, fits'));
    const frozen = await frozenXids();
    for (const table of ['readouts', 'wells', 'fits'])
      expect(frozen[table]!).toBeGreaterThan(frozenAtStart[table]!);
    expect(await plateContentSha256(plateId)).toBe(before);
    expect(before).toBe(await fresh());
  });
});
