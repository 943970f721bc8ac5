import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { countPlates, selectImporters, selectPlates, type PlateFilter, type PlateSummary } from './queries';

export type { PlateFilter, PlateSummary } from './queries';

/** Plates per page of the plates list. */
export const PLATE_PAGE_SIZE = 50;

/** One page of the plates list and how many plates match in all. */
export interface PlatePage {
  plates: PlateSummary[];
  total: number;
  page: number;
  pageSize: number;
}

/** Up to 500 plates matching the filter, newest first (the "My work" list). */
export async function listPlates(actor: Actor, filter: PlateFilter = {}): Promise<PlateSummary[]> {
  void actor; // every signed-in role may read plates
  return selectPlates(filter, 500, 0);
}

/** Page `page` (from 1) of the plates matching the filter, newest first, with the number that match. */
export async function listPlatePage(
  actor: Actor,
  filter: PlateFilter,
  page: number,
  pageSize = PLATE_PAGE_SIZE,
): Promise<PlatePage> {
  void actor; // every signed-in role may read plates
  const [plates, total] = await Promise.all([
    selectPlates(filter, pageSize, (page - 1) * pageSize),
    countPlates(filter),
  ]);
  return { plates, total, page, pageSize };
}

/** The people who imported at least one plate, for the importer filter. */
export async function listImporters(actor: Actor): Promise<{ id: string; name: string }[]> {
  void actor;
  return selectImporters();
}
