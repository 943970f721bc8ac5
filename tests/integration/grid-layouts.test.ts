import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { GRID_COLUMNS, fitLayoutToGrid } from '@/lib/domain/grid-layouts';
import { gridLayoutOf, resetGridLayout, saveGridLayout } from '@/lib/preferences/grid-layouts';
import { gridLayoutSchema, gridNameSchema } from '@/lib/validation/grid-layouts';
import { GridLayout } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

// Each person's layout of the wells grid on the real database: kept per person, read back fitted to the
// grid's columns of today, replaced by the next save, forgotten on reset; a bad layout is refused by the
// schema before anything is kept.

let first: Actor;
let second: Actor;
beforeAll(async () => {
  await resetDatabase();
  first = await makeActor(['approver']);
  second = await makeActor(['chemist']);
});
afterAll(() => db().close());

const WELLS = GRID_COLUMNS['plate-wells'];

describe('grid layouts', () => {
  test('a layout is kept for its person only, in the order given, and the next save replaces it', async () => {
    expect(await gridLayoutOf(first, 'plate-wells')).toBeNull();
    const columns = [
      { id: 'position', hidden: false, width: null },
      { id: 'compound', hidden: false, width: 180 },
      { id: 'role', hidden: true, width: null },
    ];
    await saveGridLayout(first, 'plate-wells', columns);
    const kept = (await gridLayoutOf(first, 'plate-wells'))!;
    // The three named first, as given; the nine not named after them in the grid's own order, shown.
    expect(kept.slice(0, 3)).toEqual(columns);
    expect(kept.slice(3).map((c) => c.id)).toEqual(
      WELLS.filter((id) => !['position', 'compound', 'role'].includes(id)),
    );
    expect(kept.slice(3).every((c) => !c.hidden && c.width === null)).toBe(true);
    expect(await gridLayoutOf(second, 'plate-wells')).toBeNull();

    await saveGridLayout(first, 'plate-wells', [{ id: 'position', hidden: false, width: 90 }]);
    expect((await gridLayoutOf(first, 'plate-wells'))!.map((c) => c.id)).toEqual([...WELLS]);
    expect(await GridLayout.count({ where: { userId: first.id } })).toBe(1);
  });

  test('reset forgets only the person’s own layout', async () => {
    await saveGridLayout(second, 'plate-wells', [{ id: 'qc', hidden: false, width: 300 }]);
    expect(await resetGridLayout(first, 'plate-wells')).toBe(true);
    expect(await resetGridLayout(first, 'plate-wells')).toBe(false);
    expect(await gridLayoutOf(first, 'plate-wells')).toBeNull();
    expect((await gridLayoutOf(second, 'plate-wells'))![0]).toEqual({ id: 'qc', hidden: false, width: 300 });
  });

  test('a kept layout naming a column the grid no longer has reads without it', () => {
    const fitted = fitLayoutToGrid('plate-wells', [
      { id: 'gone-column', hidden: false, width: 100 },
      { id: 'excluded', hidden: true, width: null },
      { id: 'position', hidden: true, width: null },
    ]);
    expect(fitted.map((c) => c.id)).toEqual([
      'excluded',
      'position',
      ...WELLS.filter((id) => id !== 'excluded' && id !== 'position'),
    ]);
    // The well column is always shown, whatever was kept.
    expect(fitted.find((c) => c.id === 'position')!.hidden).toBe(false);
  });

  test('the schema refuses a repeated or unknown column, a hidden well column, widths out of range', () => {
    const accepted = (columns: unknown) => gridLayoutSchema('plate-wells').safeParse({ columns }).success;
    expect(accepted([{ id: 'role', hidden: false, width: null }])).toBe(true);
    expect(
      accepted([
        { id: 'role', hidden: false, width: null },
        { id: 'role', hidden: true, width: null },
      ]),
    ).toBe(false);
    expect(accepted([{ id: 'no-such-column', hidden: false, width: null }])).toBe(false);
    expect(accepted([{ id: 'position', hidden: true, width: null }])).toBe(false);
    expect(accepted([{ id: 'role', hidden: false, width: 39 }])).toBe(false);
    expect(accepted([{ id: 'role', hidden: false, width: 1201 }])).toBe(false);
    expect(accepted([{ id: 'role', hidden: false, width: 80.5 }])).toBe(false);
    expect(accepted([])).toBe(false);
    expect(gridNameSchema.safeParse('plate-wells').success).toBe(true);
    expect(gridNameSchema.safeParse('no-such-grid').success).toBe(false);
  });
});
