import 'server-only';
import { QueryTypes } from 'sequelize';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { parseOrRefuse } from '@/lib/validation/parse';
import { AppError } from '@/lib/errors';
import { AUDIT_PAGE_SIZE, auditFilterSchema, type AuditFilter } from '@/lib/validation/audit';

/** One audit event as the audit trail shows it. */
export interface AuditRow {
  id: number;
  occurredAt: string;
  actorId: string | null;
  actorName: string | null;
  actorEmail: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  reason: string | null;
  before: unknown;
  after: unknown;
  address: string | null;
}

export interface AuditPage {
  rows: AuditRow[];
  total: number;
  page: number;
  pageSize: number;
}

/**
 * The audit trail, newest first, filtered in the database by record type, record id, person and time
 * range (from inclusive, to exclusive). Admins and approvers only.
 */
export async function searchAudit(actor: Actor, rawFilter: unknown): Promise<AuditPage> {
  requireCapability(actor, 'readAudit');
  const filter = parseOrRefuse(auditFilterSchema, rawFilter, 'The filter is not valid.');
  const { whereSql, replacements } = filterSql(filter);
  const sequelize = db();
  const [counted] = await sequelize.query<{ total: number }>(`select count(*)::int as total from audit_events a ${whereSql}`, {
    type: QueryTypes.SELECT,
    replacements,
  });
  const rows = await selectRows(whereSql, replacements, AUDIT_PAGE_SIZE, (filter.page - 1) * AUDIT_PAGE_SIZE);
  return { rows, total: counted?.total ?? 0, page: filter.page, pageSize: AUDIT_PAGE_SIZE };
}

/** Most events one export holds: beyond it the person narrows the filter. */
export const AUDIT_EXPORT_LIMIT = 100_000;

/**
 * Every event the filter matches (its page ignored), newest first, for an export: refused with a clear
 * message when more than `limit` match. Admins and approvers only.
 */
export async function auditEventsForExport(actor: Actor, rawFilter: unknown, limit = AUDIT_EXPORT_LIMIT): Promise<{ filter: AuditFilter; rows: AuditRow[] }> {
  requireCapability(actor, 'readAudit');
  const filter = parseOrRefuse(auditFilterSchema, rawFilter, 'The filter is not valid.');
  const { whereSql, replacements } = filterSql(filter);
  const rows = await selectRows(whereSql, replacements, limit + 1, 0);
  if (rows.length > limit) {
    throw new AppError('invalid', `More than ${limit.toLocaleString('en-GB')} events match; an export holds at most that many. Narrow the time range or the filter.`);
  }
  return { filter, rows };
}

/** The filter as SQL conditions on `audit_events a`. */
function filterSql(filter: AuditFilter): { whereSql: string; replacements: Record<string, unknown> } {
  const where: string[] = [];
  const replacements: Record<string, unknown> = {};
  const clauses: [keyof typeof filter, string][] = [
    ['entityType', 'a.entity_type = :entityType'],
    ['entityId', 'a.entity_id = :entityId'],
    ['userId', 'a.actor_id = :userId'],
    ['from', 'a.occurred_at >= :from'],
    ['to', 'a.occurred_at < :to'],
  ];
  for (const [key, sql] of clauses) {
    if (filter[key] === undefined) continue;
    where.push(sql);
    replacements[key] = filter[key];
  }
  return { whereSql: where.length ? `where ${where.join(' and ')}` : '', replacements };
}

/** Events matching the conditions, newest first, with the acting person. */
function selectRows(whereSql: string, replacements: Record<string, unknown>, limit: number, offset: number): Promise<AuditRow[]> {
  return db().query<AuditRow>(
    `select a.id, to_char(a.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as "occurredAt",
            a.actor_id as "actorId", u.name as "actorName", u.email as "actorEmail", a.action,
            a.entity_type as "entityType", a.entity_id as "entityId", a.reason, a.before, a.after, a.address
       from audit_events a left join users u on u.id = a.actor_id
       ${whereSql}
      order by a.occurred_at desc, a.id desc
      limit :limit offset :offset`,
    { type: QueryTypes.SELECT, replacements: { ...replacements, limit, offset } },
  );
}

/** The choices of the audit filter: record types that occur, and people. Admins and approvers only. */
export async function auditFilterChoices(actor: Actor): Promise<{ entityTypes: string[]; people: { id: string; label: string }[] }> {
  requireCapability(actor, 'readAudit');
  const sequelize = db();
  const [types, people] = await Promise.all([
    sequelize.query<{ entityType: string }>('select distinct entity_type as "entityType" from audit_events order by 1', { type: QueryTypes.SELECT }),
    sequelize.query<{ id: string; label: string }>(`select id, name || ' <' || email || '>' as label from users order by name`, { type: QueryTypes.SELECT }),
  ]);
  return { entityTypes: types.map((row) => row.entityType), people };
}
