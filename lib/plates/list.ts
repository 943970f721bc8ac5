import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { awaitingCondition } from '@/lib/signoff/awaiting';
import type { PlateState } from '@/lib/domain/plate-states';

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
  /** Targets whose Z′ fails the screen's limit. */
  failingTargets: number;
}

export interface PlateFilter {
  state?: PlateState[];
  screenId?: string;
  /** Plates waiting for this user's action (the "My work" list). */
  waitingFor?: Actor;
  importedBy?: string;
  /** Imported on or after this day (UTC, YYYY-MM-DD). */
  from?: string;
  /** Imported on or before this day (UTC, YYYY-MM-DD). */
  to?: string;
}

/** Plates per page of the plates list. */
export const PLATE_PAGE_SIZE = 50;

/** One page of the plates list and how many plates match in all. */
export interface PlatePage {
  plates: PlateSummary[];
  total: number;
  page: number;
  pageSize: number;
}

/** The filter as SQL conditions on `plates p`, or null when nothing can match. */
function filterSql(filter: PlateFilter): { where: string; replacements: Record<string, unknown> } | null {
  const where: string[] = [];
  const replacements: Record<string, unknown> = {};
  if (filter.state?.length) {
    where.push('p.state in (:states)');
    replacements.states = filter.state;
  }
  if (filter.waitingFor) {
    const awaiting = awaitingCondition(filter.waitingFor);
    if (!awaiting) return null;
    where.push(awaiting.sql);
    Object.assign(replacements, awaiting.replacements);
  }
  if (filter.screenId) {
    where.push('p.screen_id = :screenId');
    replacements.screenId = filter.screenId;
  }
  if (filter.importedBy) {
    where.push('p.imported_by = :importedBy');
    replacements.importedBy = filter.importedBy;
  }
  if (filter.from) {
    where.push("p.imported_at >= (cast(:from as date) at time zone 'UTC')");
    replacements.from = filter.from;
  }
  if (filter.to) {
    where.push("p.imported_at < ((cast(:to as date) + 1) at time zone 'UTC')");
    replacements.to = filter.to;
  }
  return { where: where.length ? `where ${where.join(' and ')}` : '', replacements };
}

/**
 * Plates, newest first, with well counts and the number of wells that fail QC on any target. The
 * counts are worked out once for the returned plates together, grouped by plate (not one subquery per
 * plate and well, whose plan depends on table statistics that lag behind a stream of imports); a well
 * fails when one of its readouts has QC reasons (found through the partial index readouts_failing_well).
 */
async function selectPlates(filter: PlateFilter, limit: number, offset: number): Promise<PlateSummary[]> {
  const sql = filterSql(filter);
  if (!sql) return [];
  return db().query<PlateSummary>(
    `with page as materialized (
       select p.id from plates p ${sql.where} order by p.imported_at desc, p.id desc limit :limit offset :offset
     ),
     well_counts as (
       select w.plate_id, count(*)::int as n from wells w where w.plate_id in (select id from page) group by w.plate_id
     ),
     failing_wells as (
       select w.plate_id, count(distinct r.well_id)::int as n
         from readouts r join wells w on w.id = r.well_id
        where jsonb_array_length(r.qc_reasons) > 0 and w.plate_id in (select id from page)
        group by w.plate_id
     )
     select p.id, p.label, p.format, p.state, s.name as "screenName", u.name as "importedBy",
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt",
            coalesce(wc.n, 0) as "wellCount", coalesce(fw.n, 0) as "failingWellCount",
            (select count(*)::int from jsonb_array_elements(p.qc_summary) q where (q -> 'zPrime' ->> 'passes')::boolean is not true) as "failingTargets"
       from page
       join plates p on p.id = page.id
       join screens s on s.id = p.screen_id
       join users u on u.id = p.imported_by
       left join well_counts wc on wc.plate_id = p.id
       left join failing_wells fw on fw.plate_id = p.id
      order by p.imported_at desc, p.id desc`,
    { type: QueryTypes.SELECT, replacements: { ...sql.replacements, limit, offset } },
  );
}

/** Up to 500 plates matching the filter, newest first (the "My work" list). */
export async function listPlates(actor: Actor, filter: PlateFilter = {}): Promise<PlateSummary[]> {
  void actor; // every signed-in role may read plates
  return selectPlates(filter, 500, 0);
}

/** Page `page` (from 1) of the plates matching the filter, newest first, with the number that match. */
export async function listPlatePage(actor: Actor, filter: PlateFilter, page: number, pageSize = PLATE_PAGE_SIZE): Promise<PlatePage> {
  void actor; // every signed-in role may read plates
  const sql = filterSql(filter);
  const [plates, [counted]] = await Promise.all([
    selectPlates(filter, pageSize, (page - 1) * pageSize),
    sql ? db().query<{ total: number }>(`select count(*)::int as total from plates p ${sql.where}`, { type: QueryTypes.SELECT, replacements: sql.replacements }) : [{ total: 0 }],
  ]);
  return { plates, total: counted?.total ?? 0, page, pageSize };
}

/** The people who imported at least one plate, for the importer filter. */
export async function listImporters(actor: Actor): Promise<{ id: string; name: string }[]> {
  void actor;
  return db().query<{ id: string; name: string }>(
    'select distinct u.id, u.name from users u join plates p on p.imported_by = u.id order by u.name',
    { type: QueryTypes.SELECT },
  );
}
