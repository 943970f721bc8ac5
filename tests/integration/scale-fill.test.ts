// The scale fill (scripts/scale/fill.ts) at a tiny size on the test database: it writes through the real
// schema as the app's role, so the rows it leaves must be what Gatewell's own services would leave — every
// trigger and constraint on and valid, one duty per signer and round, signatures that verify on read.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { plateContentSha256 } from '@/lib/signoff/plate-content';
import { parseId } from '@/lib/validation/ids';
import { fillScale, PATHS, type FillResult, type SignoffPath } from '@/scripts/scale/fill';
import { makeActor } from '../support/actors';
import { asSchemaOwner, resetDatabase } from '../support/database';

const PATH_LIST = Object.keys(PATHS) as SignoffPath[];
/** Where each path ends (lib/domain/plate-states.ts: a rework returns the plate to imported). */
const FINAL_STATE: Record<SignoffPath, string> = {
  imported: 'imported',
  verified: 'verified',
  submitted: 'submitted',
  approved: 'approved',
  rejected: 'rejected',
  reopened: 'imported',
  reworked: 'approved',
};
const PLATES = PATH_LIST.length;
const COMPOUNDS = 80;

let result: FillResult;

async function rows<T extends object>(sql: string, replacements: Record<string, unknown> = {}): Promise<T[]> {
  return db().query<T>(sql, { type: QueryTypes.SELECT, replacements });
}

beforeAll(async () => {
  await resetDatabase();
  await makeActor(['admin']);
  await makeActor(['biologist']);
  await makeActor(['chemist']);
  await makeActor(['approver']);
  await makeActor(['approver']);
  result = await fillScale({
    plates: PLATES,
    compounds: COMPOUNDS,
    screens: 2,
    templates: 1,
    batch: 3,
    forecasts: 1,
    hashConcurrency: 2,
    writers: 2,
    tag: 'tst',
    paths: PATH_LIST,
    log: () => {},
  });
}, 180_000);

afterAll(async () => {
  await db().close();
});

describe('scale fill at a tiny size', () => {
  test('writes 384 wells, two readouts a well and a fit per compound and target on every plate', async () => {
    const [counts] = await rows<Record<string, number>>(
      `select (select count(*)::int from plates) as plates, (select count(*)::int from wells) as wells,
              (select count(*)::int from readouts) as readouts, (select count(*)::int from fits) as fits,
              (select count(*)::int from compounds) as compounds, (select count(*)::int from forecasts) as forecasts`,
    );
    // The layout the fill states (scripts/scale/templates.ts): 16 × 24 wells, two targets, 80 compounds a plate.
    expect(counts).toEqual({
      plates: PLATES,
      wells: PLATES * 384,
      readouts: PLATES * 384 * 2,
      fits: PLATES * 80 * 2,
      compounds: COMPOUNDS,
      forecasts: 1,
    });
    const perPlate = await rows<{ n: number }>(
      'select count(distinct compound_id)::int as n from wells where compound_id is not null group by plate_id',
    );
    expect(perPlate.map((p) => p.n)).toEqual(Array(PLATES).fill(80));
  });

  test('gives ids the routes of the app take (lib/validation/ids.ts), so every page of the fill opens', async () => {
    const [ids] = await rows<{ wells: string[]; signatures: string[] }>(
      `select (select array_agg(id::text) from wells) as wells, (select array_agg(id::text) from signatures) as signatures`,
    );
    for (const id of [...result.plateIds, ...result.compoundIds, ...ids!.wells, ...ids!.signatures])
      expect(parseId(id)).toBe(id);
  });

  test('leaves each plate in the state its sign-off path ends in, with one event per step', async () => {
    const plates = await rows<{ id: string; state: string; version: number; events: number }>(
      `select p.id, p.state, p.version, (select count(*)::int from signoff_events e where e.plate_id = p.id) as events
         from plates p`,
    );
    const byId = new Map(plates.map((p) => [p.id, p]));
    result.plateIds.forEach((id, i) => {
      // Plate n (from 1) takes path n mod the number of paths.
      const path = PATH_LIST[(i + 1) % PATH_LIST.length]!;
      expect(byId.get(id)).toMatchObject({
        state: FINAL_STATE[path],
        version: 1 + PATHS[path].length,
        events: PATHS[path].length,
      });
    });
  });

  test('keeps one duty per signer and round, and the reworked plate signs its second round', async () => {
    const twice = await rows<{ n: number }>(
      `select count(*)::int as n from signoff_events e join signatures s on s.id = e.signature_id
        where e.to_state <> 'imported' group by e.plate_id, e.round, s.signer_id having count(*) > 1`,
    );
    expect(twice).toEqual([]);
    const rounds = await rows<{ round: number }>(
      `select distinct e.round from signoff_events e where e.to_state = 'approved' order by 1`,
    );
    expect(rounds.map((r) => r.round)).toEqual([0, 1]);
  });

  test('signs the content the app hashes on read, so the history shows every signature intact', async () => {
    const signed = await rows<{ plateId: string; sha: string }>(
      `select entity_id as "plateId", content_sha256 as sha from signatures where entity_type = 'plate'`,
    );
    expect(signed.length).toBe(Object.values(PATHS).reduce((n, steps) => n + steps.length, 0));
    for (const { plateId, sha } of signed) expect(sha).toBe(await plateContentSha256(plateId));
  });

  test('writes an audit event for each import, compound, signature and step', async () => {
    const [audit] = await rows<Record<string, number>>(
      `select count(*) filter (where action = 'import')::int as imports,
              count(*) filter (where action = 'create' and entity_type = 'compound')::int as compounds,
              count(*) filter (where action = 'sign')::int as signatures,
              count(*) filter (where action in ('verify', 'submit', 'approve', 'reject', 'rework'))::int as steps
         from audit_events`,
    );
    const steps = Object.values(PATHS).reduce((n, list) => n + list.length, 0);
    expect(audit).toEqual({ imports: PLATES, compounds: COMPOUNDS, signatures: steps, steps });
  });

  test('leaves every trigger on and every constraint valid, and approved plates locked', async () => {
    await asSchemaOwner(async (client) => {
      const off = await client.query(
        `select tgname from pg_trigger t join pg_class c on c.oid = t.tgrelid
          where c.relnamespace = 'public'::regnamespace and not t.tgisinternal and t.tgenabled <> 'O'`,
      );
      expect(off.rows).toEqual([]);
      const invalid = await client.query(
        `select conname from pg_constraint where connamespace = 'public'::regnamespace and not convalidated`,
      );
      expect(invalid.rows).toEqual([]);
    });
    const [approved] = await rows<{ id: string }>(`select id from plates where state = 'approved' limit 1`);
    await expect(
      db().query('update wells set excluded = true, exclusion_reason = :reason where plate_id = :id', {
        replacements: { id: approved!.id, reason: 'test' },
      }),
    ).rejects.toThrow(/approved and locked/);
  });
});
