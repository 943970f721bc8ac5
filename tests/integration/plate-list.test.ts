import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listImporters, listPlates } from '@/lib/plates/list';
import { plateFilterSchema } from '@/lib/validation/plate-filter';
import { threeDemoPlatesSetup } from '../support/demo-plates';

describe('plates list filters on the real database', () => {
  let biologist: Actor;
  let screens: Record<string, string>;

  beforeAll(async () => {
    ({ biologist, screens } = await threeDemoPlatesSetup());
  });
  afterAll(() => db().close());

  test('by screen, state, importer and date; the noisy plate counts as failing Z′', async () => {
    const nav = await listPlates(biologist, { screenId: screens['Nav1.7']! });
    expect(nav.map((p) => p.label).sort()).toEqual(['NAV-P01', 'NAV-P03']);
    expect(nav.find((p) => p.label === 'NAV-P03')!.failingTargets).toBe(1);
    expect(nav.find((p) => p.label === 'NAV-P01')!.failingTargets).toBe(0);
    expect(await listPlates(biologist, { state: ['approved'] })).toEqual([]);
    expect(await listPlates(biologist, { importedBy: biologist.id })).toHaveLength(3);
    expect(await listImporters(biologist)).toEqual([{ id: biologist.id, name: biologist.name }]);
    const today = new Date().toISOString().slice(0, 10);
    expect(await listPlates(biologist, { from: today, to: today })).toHaveLength(3);
    expect(await listPlates(biologist, { to: '2000-01-01' })).toEqual([]);
  });

  test('unreadable filter values are dropped rather than failing the page', () => {
    expect(plateFilterSchema.parse({ screen: 'not-a-uuid', state: 'lost', from: '1 May', to: '' })).toEqual(
      {},
    );
  });
});
