import pg from 'pg';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { contentSha256 } from '@/lib/auth/canonical-json';
import { db } from '@/lib/db';
import { plateContent, plateContentSha256 } from '@/lib/signoff/plate-content';
import { asSchemaOwner, resetDatabase } from '../support/database';
import { signoffCast } from '../support/signoff-scenario';

// The history tab shows the plate's data hash from a cache checked against PostgreSQL's row versions
// (lib/signoff/plate-content.ts). Every check here compares the cached answer with the hash worked out
// afresh from the data, after a change made straight in SQL, behind Gatewell's back.
describe('the plate data hash the history tab shows', () => {
  let plateId: string;
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
    ({ plateId } = await signoffCast());
  });
  afterAll(() => db().close());

  test('is the hash of the data as it stands, asked once or again', async () => {
    const first = await plateContentSha256(plateId);
    expect(first).toBe(await fresh());
    expect(await plateContentSha256(plateId)).toBe(first);
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
  ])('follows %s changed in SQL', async (_what, change) => {
    const before = await plateContentSha256(plateId);
    await sql(change);
    const after = await plateContentSha256(plateId);
    expect(after).not.toBe(before);
    expect(after).toBe(await fresh());
  });

  // The app's role owns no table (migrations/20261205000100-app-role-privileges.js), so PostgreSQL 15 skips
  // each table of its VACUUM with a warning and freezes nothing: this fails if the app's role owned a table
  // or the database. Freezing is then done as the schema's owner, and the hash must not move.
  test('stays the same when rows are rewritten with the same values or frozen by VACUUM', async () => {
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
