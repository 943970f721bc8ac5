// The entity tags of a plate's wells and fits answers on the real database: the same while nothing the
// answers show has changed, new after a change to the plate's content (through the review service and in
// SQL), its workflow columns or its screen's targets, and different between the two answers and plates.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { keptTaggedJson, plateAnswerTag, requestHoldsTag } from '@/lib/plates/answer-tag';
import { listPlateWells } from '@/lib/plates/detail';
import { setWellExclusion } from '@/lib/plates/review';
import { Well } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

describe('plate answer tags', () => {
  let biologist: Actor;
  let plateId: string;
  let otherPlateId: string;

  beforeAll(async () => {
    await resetDatabase();
    const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
    plateId = await importDemoPlate(biologist, screens, 'nav-96-plate-01.xlsx');
    otherPlateId = await importDemoPlate(biologist, screens, 'kv-96-plate-01.csv');
  }, 120_000);
  afterAll(() => db().close());

  const tags = async () => [
    await plateAnswerTag(biologist, plateId, 'wells'),
    await plateAnswerTag(biologist, plateId, 'fits'),
  ];

  test('stay while nothing changes, and differ between answers and plates', async () => {
    const [wells, fits] = await tags();
    expect(wells).toMatch(/^"[\w-]{27}"$/);
    expect(fits).not.toBe(wells);
    expect(await tags()).toEqual([wells, fits]);
    expect(await plateAnswerTag(biologist, otherPlateId, 'wells')).not.toBe(wells);
    // Whoever asks gets the same tag: the answers do not depend on the reader.
    expect(await plateAnswerTag(await makeActor([]), plateId, 'wells')).toBe(wells);
  });

  test('change with an exclusion through the review service', async () => {
    const before = await tags();
    const well = await Well.findOne({ where: { plateId, position: 'H12' }, rejectOnEmpty: true });
    await setWellExclusion(biologist, plateId, { wellIds: [well.id], excluded: true, reason: 'seal lost' });
    const after = await tags();
    expect(after[0]).not.toBe(before[0]);
    expect(after[1]).not.toBe(before[1]);
  });

  test.each([
    [
      'a readout current in SQL',
      `update readouts set compound_current_pa = compound_current_pa + 1 where id = (select r.id from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by r.id limit 1)`,
    ],
    [
      'a fit message in SQL',
      `update fits set message = message || ' (edited)' where id = (select id from fits where plate_id = :plateId order by id limit 1)`,
    ],
    ['the plate state', `update plates set state = 'verified' where id = :plateId`],
    ['fits pending', `update plates set fits_pending = not fits_pending where id = :plateId`],
    [
      'a target renamed',
      `update targets set name = name || ' (renamed)', updated_at = now() where screen_id = (select screen_id from plates where id = :plateId)`,
    ],
  ])('change with %s', async (_what, sql) => {
    const before = await tags();
    await db().query(sql, { replacements: { plateId } });
    const after = await tags();
    expect(after[0]).not.toBe(before[0]);
    expect(after[1]).not.toBe(before[1]);
  });

  test('a kept answer is served again under its tag and built afresh under a new one', async () => {
    let builds = 0;
    const build = async () => {
      builds += 1;
      return { wells: await listPlateWells(biologist, plateId) };
    };
    const excludedOf = (body: { wells: { position: string; excluded: boolean }[] }) =>
      body.wells.filter((w) => w.excluded).map((w) => w.position);
    const tag = await plateAnswerTag(biologist, plateId, 'wells');
    const first = await keptTaggedJson(plateId, 'wells', tag, build);
    const second = await keptTaggedJson(plateId, 'wells', tag, build);
    expect(builds).toBe(1);
    expect(second.headers.get('etag')).toBe(tag);
    expect(second.headers.get('content-type')).toBe('application/json');
    const kept = await second.json();
    expect(kept).toEqual(await first.json());
    // The H12 exclusion of the test above is in it, G12 not yet.
    expect(excludedOf(kept)).toContain('H12');
    expect(excludedOf(kept)).not.toContain('G12');

    const well = await Well.findOne({ where: { plateId, position: 'G12' }, rejectOnEmpty: true });
    await setWellExclusion(biologist, plateId, { wellIds: [well.id], excluded: true, reason: 'seal lost' });
    const newTag = await plateAnswerTag(biologist, plateId, 'wells');
    expect(newTag).not.toBe(tag);
    const fresh = await (await keptTaggedJson(plateId, 'wells', newTag, build)).json();
    expect(builds).toBe(2);
    expect(excludedOf(fresh)).toContain('G12');
  });

  test('a build that fails is not kept', async () => {
    const tag = await plateAnswerTag(biologist, otherPlateId, 'fits');
    await expect(
      keptTaggedJson(otherPlateId, 'fits', tag, () => Promise.reject(new Error('database gone'))),
    ).rejects.toThrow('database gone');
    const answer = await keptTaggedJson(otherPlateId, 'fits', tag, async () => ({ fits: ['built again'] }));
    expect(await answer.json()).toEqual({ fits: ['built again'] });
  });

  test('a missing plate has no tag', async () => {
    await expect(
      plateAnswerTag(biologist, '00000000-0000-4000-8000-000000000000', 'wells'),
    ).rejects.toMatchObject({ code: 'not_found' });
  });

  test('If-None-Match holds a tag alone, in a list, weak, or as *', () => {
    const ask = (value?: string) =>
      new Request('http://gatewell.test/', value ? { headers: { 'if-none-match': value } } : {});
    expect(requestHoldsTag(ask('"abc"'), '"abc"')).toBe(true);
    expect(requestHoldsTag(ask('"x", W/"abc"'), '"abc"')).toBe(true);
    expect(requestHoldsTag(ask('*'), '"abc"')).toBe(true);
    expect(requestHoldsTag(ask('"abd"'), '"abc"')).toBe(false);
    expect(requestHoldsTag(ask(), '"abc"')).toBe(false);
  });
});
