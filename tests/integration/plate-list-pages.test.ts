// The plates list in pages: page sizes, order, totals and the failing-well count, on the real database.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listPlatePage, listPlates, PLATE_PAGE_SIZE } from '@/lib/plates/list';
import { myWorkPageHref, platePageHref, platePageSchema } from '@/lib/validation/plate-filter';
import { makeActor } from '../support/actors';
import { threeDemoPlatesSetup } from '../support/demo-plates';

describe('plates list pages on the real database', () => {
  let biologist: Actor;
  let screens: Record<string, string>;

  beforeAll(async () => {
    ({ biologist, screens } = await threeDemoPlatesSetup());
  });
  afterAll(() => db().close());

  test('pages hold the newest plates first, and a page past the end is empty with the total kept', async () => {
    const newestFirst = ['NAV-P03', 'KV-P01', 'NAV-P01'];
    const first = await listPlatePage(biologist, {}, 1, 2);
    expect(first).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(first.plates.map((p) => p.label)).toEqual(newestFirst.slice(0, 2));
    expect((await listPlatePage(biologist, {}, 2, 2)).plates.map((p) => p.label)).toEqual(
      newestFirst.slice(2),
    );
    expect(await listPlatePage(biologist, {}, 3, 2)).toMatchObject({ plates: [], total: 3 });
    expect(await listPlatePage(biologist, { screenId: screens['Kv7.2']! }, 1)).toMatchObject({
      total: 1,
      pageSize: PLATE_PAGE_SIZE,
    });
    expect(await listPlatePage(biologist, { state: ['approved'] }, 1)).toMatchObject({
      plates: [],
      total: 0,
    });
  });

  test('a page holds the same rows as the whole list, and a well fails when any of its readouts has QC reasons', async () => {
    const page = await listPlatePage(biologist, {}, 1);
    expect(page.plates).toEqual(await listPlates(biologist));
    // The count as first written (distinct wells joined to failing readouts), worked out directly.
    const expected = await db().query<{ label: string; failing: number }>(
      `select p.label, (select count(distinct w.id)::int from wells w join readouts r on r.well_id = w.id
                         where w.plate_id = p.id and jsonb_array_length(r.qc_reasons) > 0) as failing
         from plates p`,
      { type: QueryTypes.SELECT },
    );
    for (const { label, failing } of expected)
      expect(page.plates.find((p) => p.label === label)!.failingWellCount).toBe(failing);
    expect(expected.every(({ failing }) => failing > 0)).toBe(true);
  });

  test('My work comes in pages too: the plates waiting for a person, newest first, with their total', async () => {
    // Freshly imported plates wait for a chemist to verify their compound maps; nothing waits for the biologist yet.
    const chemist = await makeActor(['chemist']);
    const waiting = await listPlates(chemist, { waitingFor: chemist });
    expect(waiting.map((p) => p.label)).toEqual(['NAV-P03', 'KV-P01', 'NAV-P01']);
    const first = await listPlatePage(chemist, { waitingFor: chemist }, 1, 2);
    const second = await listPlatePage(chemist, { waitingFor: chemist }, 2, 2);
    expect(first).toMatchObject({ total: 3, page: 1 });
    expect([...first.plates, ...second.plates]).toEqual(waiting);
    expect(await listPlatePage(chemist, { waitingFor: chemist }, 3, 2)).toMatchObject({
      plates: [],
      total: 3,
    });
    expect(await listPlatePage(biologist, { waitingFor: biologist }, 1)).toMatchObject({
      plates: [],
      total: 0,
    });
    expect([myWorkPageHref(1), myWorkPageHref(2)]).toEqual(['/', '/?page=2']);
  });

  test.each([
    ['2', 2],
    [undefined, 1],
    ['0', 1],
    ['-3', 1],
    ['1.5', 1],
    ['many', 1],
    [['4', '5'], 4],
  ])('page parameter %j reads as page %i', (raw, page) => {
    expect(platePageSchema.parse(raw)).toBe(page);
  });

  test('page links keep the filters and leave page 1 without a page parameter', () => {
    const filter = {
      screen: '7f0c1d9e-2b44-4a55-9d1e-0a2b3c4d5e6f',
      state: undefined,
      importer: undefined,
      from: '2026-01-01',
      to: undefined,
    };
    expect(platePageHref(filter, 1)).toBe(
      '/plates?screen=7f0c1d9e-2b44-4a55-9d1e-0a2b3c4d5e6f&from=2026-01-01',
    );
    expect(platePageHref(filter, 3)).toBe(
      '/plates?screen=7f0c1d9e-2b44-4a55-9d1e-0a2b3c4d5e6f&from=2026-01-01&page=3',
    );
    expect(platePageHref({}, 2)).toBe('/plates?page=2');
    expect(platePageHref({}, 1)).toBe('/plates');
  });
});
