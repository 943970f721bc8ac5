import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { readoutRatio, type FitStatus } from '@/lib/domain/fits';
import { selectCompoundFits, type ProfileFit } from './queries';

export type { ProfileFit } from './queries';

/** Every fit of the compound across plates and screens: approved plates first, then newest first. */
export async function listCompoundFits(actor: Actor, compoundId: string): Promise<ProfileFit[]> {
  void actor; // every signed-in role may read results
  return selectCompoundFits(compoundId);
}

const USABLE: FitStatus[] = ['fitted', 'above_range', 'inactive'];

/**
 * The fit that stands for the compound's potency on each target: from approved plates when there is
 * one, otherwise from plates not yet approved; the newest plate with a usable result (an IC50 or a bound).
 */
export function choosePotencies(fits: ProfileFit[]): Map<string, ProfileFit> {
  const chosen = new Map<string, ProfileFit>();
  const ordered = [...fits].sort(
    (a, b) => Number(b.approved) - Number(a.approved) || b.importedAt.localeCompare(a.importedAt),
  );
  for (const fit of ordered) {
    if (fit.readout !== 'tonic') continue;
    if (!chosen.has(fit.targetId) && USABLE.includes(fit.status)) chosen.set(fit.targetId, fit);
  }
  return chosen;
}

/** A chosen tonic fit with the use-dependent fit of the same plate, compound and target, and their ratio. */
export interface UseDependence {
  tonic: ProfileFit;
  useDependent: ProfileFit;
  /** Tonic IC50 ÷ use-dependent IC50; null unless both are fitted estimates. */
  ratio: number | null;
}

/** For each standing potency whose plate also fitted the use-dependent readout: both fits and their ratio. */
export function pairUseDependence(
  potencies: readonly ProfileFit[],
  fits: readonly ProfileFit[],
): UseDependence[] {
  return potencies.flatMap((tonic) => {
    const useDependent = fits.find(
      (f) => f.readout === 'use_dependent' && f.plateId === tonic.plateId && f.targetId === tonic.targetId,
    );
    if (!useDependent) return [];
    const estimate = (f: ProfileFit) => (f.status === 'fitted' ? f.ic50_uM : null);
    return [{ tonic, useDependent, ratio: readoutRatio(estimate(tonic), estimate(useDependent)) }];
  });
}
