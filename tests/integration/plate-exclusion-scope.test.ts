// An exclusion names wells by id on one plate: a well of the same name, holding the same compound, on
// another plate of the same screen must not change. This fails if exclusions were matched by well name,
// compound or concentration instead of by the plate's own well ids, or if a recompute spread to other plates.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listPlateWells } from '@/lib/plates/detail';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { setWellExclusion } from '@/lib/plates/review';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { demoFile, makeDemoScreens } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

let biologist: Actor;
let first: string;
let second: string;

beforeAll(async () => {
  await resetDatabase();
  const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
  biologist = await makeActor(['biologist']);
  first = await importDemoPlate(biologist, screens, 'kv-96-plate-01.csv', { label: 'KV-A' });
  // The same export once more, with one more line ending so it is not refused as the same file: two
  // plates whose wells have the same names, compounds and concentrations.
  const { bytes } = demoFile('kv-96-plate-01.csv');
  const upload = {
    screenId: screens['Kv7.2']!,
    bytes: new Uint8Array([...bytes, 0x0a]),
    filename: 'kv-96-plate-01-again.csv',
    mediaType: 'text/csv',
  };
  const inspection = await inspectUpload(biologist, upload);
  const sheet = inspection.sheets[0]!;
  ({ plateId: second } = await commitImport(biologist, {
    draftId: inspection.draftId!,
    sheet: sheet.name,
    mapping: sheet.guess.mapping,
    label: 'KV-B',
  }));
  await fitsCurrent(second);
});
afterAll(() => db().close());

/** The plate row, its wells, readouts and fits, and its audit events, as stored. */
async function stored(plateId: string) {
  const [row] = await db().query<Record<string, unknown>>(
    `select (select to_jsonb(p) from plates p where p.id = :plateId) as plate,
            (select jsonb_agg(to_jsonb(w) order by w.id) from wells w where w.plate_id = :plateId) as wells,
            (select jsonb_agg(to_jsonb(r) order by r.id) from readouts r join wells w on w.id = r.well_id
              where w.plate_id = :plateId) as readouts,
            (select jsonb_agg(to_jsonb(f) order by f.id) from fits f where f.plate_id = :plateId) as fits,
            (select count(*)::int from audit_events a where a.entity_id::text = :plateId) as "auditEvents"`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return row;
}

test('excluding a well on one plate leaves the well of the same name and compound on another plate alone', async () => {
  const firstWells = await listPlateWells(biologist, first);
  const secondWells = await listPlateWells(biologist, second);
  // A test well whose name, compound and concentration are the same on both plates (all are, by construction).
  const twin = firstWells.find(
    (w) =>
      w.role === 'test' &&
      !w.excluded &&
      secondWells.some(
        (o) =>
          o.position === w.position &&
          o.compoundId === w.compoundId &&
          o.concentration_uM === w.concentration_uM &&
          !o.excluded,
      ),
  );
  expect(twin, 'the two plates share a well of the same name, compound and concentration').toBeDefined();
  const otherTwin = secondWells.find((o) => o.position === twin!.position)!;
  const secondBefore = await stored(second);

  const result = await setWellExclusion(biologist, first, {
    wellIds: [twin!.id],
    excluded: true,
    reason: 'seal lost during the compound addition',
  });
  expect(result.changed).toBe(1);
  await fitsCurrent(first);

  expect((await listPlateWells(biologist, first)).find((w) => w.id === twin!.id)!.excluded).toBe(true);
  expect((await listPlateWells(biologist, second)).find((w) => w.id === otherTwin.id)!.excluded).toBe(false);
  expect(await stored(second)).toEqual(secondBefore);
});

test('a well id of another plate is not excluded through this plate', async () => {
  const secondWell = (await listPlateWells(biologist, second)).find((w) => w.role === 'test' && !w.excluded)!;
  const secondBefore = await stored(second);
  const firstBefore = await stored(first);
  const outcome = await setWellExclusion(biologist, first, {
    wellIds: [secondWell.id],
    excluded: true,
    reason: 'wrong plate',
  }).then(
    (value) => value,
    (error: unknown) => error,
  );
  expect(await stored(second)).toEqual(secondBefore);
  expect(await stored(first)).toEqual(firstBefore);
  expect(outcome).toMatchObject({
    code: 'invalid',
    message: 'Some of the chosen wells are not on this plate.',
  });
});
