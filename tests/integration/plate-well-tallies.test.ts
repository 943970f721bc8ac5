import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listPlatePage } from '@/lib/plates/list';
import { setWellExclusion } from '@/lib/plates/review';
import { resetDatabase } from '../support/database';
import { signoffCast } from '../support/signoff-scenario';

// The plate list reads each plate's well count and failing-well count from plate_well_tallies, which
// triggers keep true (migrations/20261211001100-plate-well-tallies-and-filter-indexes.js). Each check
// compares the list with the counts worked out here from the wells and readouts themselves (a well fails
// when one of its readouts has QC reasons, docs/plates.md), after an import, after changes made straight
// in SQL behind Gatewell's back, and after an exclusion through the review service.
describe('the well counts of the plate list', () => {
  let plateId: string;
  let biologist: Actor;
  const sql = (text: string) => db().query(text, { replacements: { plateId } });
  const counted = async () => {
    const [row] = await db().query<{ wells: number; failing: number }>(
      `select (select count(*)::int from wells where plate_id = :plateId) as wells,
              (select count(*)::int from wells w where w.plate_id = :plateId
                  and exists (select 1 from readouts r where r.well_id = w.id and r.qc_reasons <> '[]'::jsonb)) as failing`,
      { type: QueryTypes.SELECT, replacements: { plateId } },
    );
    return row!;
  };
  const listed = async () => {
    const page = await listPlatePage(biologist, {}, 1);
    const plate = page.plates.find((p) => p.id === plateId)!;
    return { wells: plate.wellCount, failing: plate.failingWellCount };
  };

  beforeAll(async () => {
    await resetDatabase();
    ({ plateId, biologist } = await signoffCast());
  });
  afterAll(() => db().close());

  test('are the counts of the imported plate', async () => {
    const now = await counted();
    // The demo plate nav-96-plate-01.xlsx has 96 wells, some failing QC (tests/fixtures/demo-plates).
    expect(now.wells).toBe(96);
    expect(now.failing).toBeGreaterThan(0);
    expect(await listed()).toEqual(now);
  });

  test.each([
    [
      'QC reasons given to a passing well',
      `update readouts set qc_reasons = '["edited in SQL"]'::jsonb where id = (
         select r.id from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId
            and not exists (select 1 from readouts x where x.well_id = w.id and x.qc_reasons <> '[]'::jsonb)
          order by r.id limit 1)`,
      +1,
    ],
    [
      'QC reasons cleared from a failing well',
      `update readouts set qc_reasons = '[]'::jsonb where well_id = (
         select w.id from wells w where w.plate_id = :plateId
            and exists (select 1 from readouts x where x.well_id = w.id and x.qc_reasons <> '[]'::jsonb)
          order by w.id limit 1)`,
      -1,
    ],
    [
      "a failing well's readouts removed",
      `delete from readouts where well_id = (
         select w.id from wells w where w.plate_id = :plateId
            and exists (select 1 from readouts x where x.well_id = w.id and x.qc_reasons <> '[]'::jsonb)
          order by w.id desc limit 1)`,
      -1,
    ],
  ])('follow %s in SQL', async (_what, change, step) => {
    const before = await counted();
    await sql(change);
    const after = await counted();
    expect(after.failing).toBe(before.failing + step);
    expect(await listed()).toEqual(after);
  });

  test('follow an exclusion through the review service, which recomputes QC', async () => {
    const [well] = await db().query<{ id: string }>(
      `select id from wells where plate_id = :plateId and role = 'vehicle' and not excluded order by id limit 1`,
      { type: QueryTypes.SELECT, replacements: { plateId } },
    );
    await setWellExclusion(biologist, plateId, { wellIds: [well!.id], excluded: true, reason: 'seal lost' });
    expect(await listed()).toEqual(await counted());
  });

  test("the app's role may read the counts but not set them", async () => {
    await expect(
      sql(`update plate_well_tallies set failing_wells = 0 where plate_id = :plateId`),
    ).rejects.toThrow('permission denied for table plate_well_tallies');
  });
});
