import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import type { FitModel, FitStatus } from '@/models/fit';
import type { PlateState } from '@/lib/domain/plate-states';

/** One fit of a compound on one plate, with where it stands in sign-off. */
export interface ProfileFit {
  fitId: string;
  plateId: string;
  plateLabel: string;
  plateState: PlateState;
  /** Only approved plates count as results (DESIGN.md, Results); the rest are shown as not yet approved. */
  approved: boolean;
  importedAt: string;
  screenId: string;
  screenName: string;
  targetId: string;
  target: string;
  conductance: string;
  model: FitModel;
  status: FitStatus;
  message: string;
  ic50_uM: number | null;
  ic50CiLow_uM: number | null;
  ic50CiHigh_uM: number | null;
  ic50LowerBound_uM: number | null;
  hill: number | null;
  r2: number | null;
  n: number;
}

/** Every fit of the compound across plates and screens: approved plates first, then newest first. */
export async function listCompoundFits(actor: Actor, compoundId: string): Promise<ProfileFit[]> {
  void actor; // every signed-in role may read results
  return db().query<ProfileFit>(
    `select f.id as "fitId", p.id as "plateId", p.label as "plateLabel", p.state as "plateState", (p.state = 'approved') as approved,
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt",
            s.id as "screenId", s.name as "screenName", t.id as "targetId", t.name as target, t.conductance,
            f.model, f.status, f.message, f.ic50_um as "ic50_uM", f.ic50_ci_low_um as "ic50CiLow_uM", f.ic50_ci_high_um as "ic50CiHigh_uM",
            f.ic50_lower_bound_um as "ic50LowerBound_uM", f.hill, f.r2, f.n
       from fits f join plates p on p.id = f.plate_id join screens s on s.id = p.screen_id join targets t on t.id = f.target_id
      where f.compound_id = :compoundId
      order by (p.state = 'approved') desc, p.imported_at desc, p.label, t.name`,
    { type: QueryTypes.SELECT, replacements: { compoundId } },
  );
}

const USABLE: FitStatus[] = ['fitted', 'above_range', 'inactive'];

/**
 * The fit that stands for the compound's potency on each target: from approved plates when there is
 * one, otherwise from plates not yet approved; the newest plate with a usable result (an IC50 or a bound).
 */
export function choosePotencies(fits: ProfileFit[]): Map<string, ProfileFit> {
  const chosen = new Map<string, ProfileFit>();
  const ordered = [...fits].sort((a, b) => Number(b.approved) - Number(a.approved) || b.importedAt.localeCompare(a.importedAt));
  for (const fit of ordered) {
    if (!chosen.has(fit.targetId) && USABLE.includes(fit.status)) chosen.set(fit.targetId, fit);
  }
  return chosen;
}
