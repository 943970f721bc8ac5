import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { fitLayoutToGrid, type GridColumnChoice, type GridName } from '@/lib/domain/grid-layouts';
import { GridLayout } from '@/models';

/**
 * A person's own layout of a grid: which columns are shown, their order and widths. Each person reads and
 * writes only their own (the actor's id is the key; no call names another person). Layouts are how a person
 * likes to read a grid and are not audited (migrations/20261211005000-user-grid-layouts.js).
 */

/** The actor's layout of the grid, fitted to its columns today; null when they never arranged it. */
export async function gridLayoutOf(actor: Actor, grid: GridName): Promise<GridColumnChoice[] | null> {
  db();
  const row = await GridLayout.findOne({ where: { userId: actor.id, grid }, raw: true });
  return row ? fitLayoutToGrid(grid, row.columns) : null;
}

/** Keeps the actor's layout of the grid (the columns checked by gridLayoutSchema), replacing the last. */
export async function saveGridLayout(
  actor: Actor,
  grid: GridName,
  columns: GridColumnChoice[],
): Promise<GridColumnChoice[]> {
  const fitted = fitLayoutToGrid(grid, columns);
  await db().transaction(async (transaction) => {
    await GridLayout.upsert(
      { userId: actor.id, grid, columns: fitted, updatedAt: new Date() },
      { transaction },
    );
  });
  return fitted;
}

/** Forgets the actor's layout of the grid: the grid's own again. True when there was one. */
export async function resetGridLayout(actor: Actor, grid: GridName): Promise<boolean> {
  return db().transaction(
    async (transaction) => (await GridLayout.destroy({ where: { userId: actor.id, grid }, transaction })) > 0,
  );
}
