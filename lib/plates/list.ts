import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { awaitingCondition } from '@/lib/signoff/awaiting';
import type { PlateState } from '@/models/plate';

export interface PlateSummary {
  id: string;
  label: string;
  format: number;
  state: PlateState;
  screenName: string;
  importedBy: string;
  importedAt: string;
  wellCount: number;
  failingWellCount: number;
}

export interface PlateFilter {
  state?: PlateState[];
  screenId?: string;
  /** Plates waiting for this user's action (the "My work" list). */
  waitingFor?: Actor;
}

/** Plates, newest first, with well counts and the number of wells that fail QC on any target. */
export async function listPlates(actor: Actor, filter: PlateFilter = {}): Promise<PlateSummary[]> {
  void actor; // every signed-in role may read plates
  const where: string[] = [];
  const replacements: Record<string, unknown> = {};
  if (filter.state?.length) {
    where.push('p.state in (:states)');
    replacements.states = filter.state;
  }
  if (filter.waitingFor) {
    const awaiting = awaitingCondition(filter.waitingFor);
    if (!awaiting) return [];
    where.push(awaiting.sql);
    Object.assign(replacements, awaiting.replacements);
  }
  if (filter.screenId) {
    where.push('p.screen_id = :screenId');
    replacements.screenId = filter.screenId;
  }
  return db().query<PlateSummary>(
    `select p.id, p.label, p.format, p.state, s.name as "screenName", u.name as "importedBy",
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt",
            (select count(*)::int from wells w where w.plate_id = p.id) as "wellCount",
            (select count(distinct w.id)::int from wells w join readouts r on r.well_id = w.id
              where w.plate_id = p.id and jsonb_array_length(r.qc_reasons) > 0) as "failingWellCount"
       from plates p
       join screens s on s.id = p.screen_id
       join users u on u.id = p.imported_by
      ${where.length ? `where ${where.join(' and ')}` : ''}
      order by p.imported_at desc
      limit 500`,
    { type: QueryTypes.SELECT, replacements },
  );
}
