import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { selectCompoundSummaries, type CompoundSummary } from './queries';

export type { CompoundSummary } from './queries';

/** Registered compounds with how many batches and plates they appear in. */
export async function listCompounds(actor: Actor): Promise<CompoundSummary[]> {
  void actor; // every signed-in role may read the registry
  return selectCompoundSummaries();
}
