import 'server-only';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import type { AuditFilter } from '@/lib/validation/audit';

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

// SQL for speed: a count over a table that only grows, with the same conditions as the page.
export async function countAuditEvents(filter: AuditFilter): Promise<number> {
  const { whereSql, replacements } = filterSql(filter);
  const [counted] = await db().query<{ total: number }>(
    `select count(*)::int as total from audit_events a ${whereSql}`,
    {
      type: QueryTypes.SELECT,
      replacements,
    },
  );
  return counted?.total ?? 0;
}

// SQL for speed: events matching the filter, newest first, with the acting person, times as UTC text to the millisecond.
export function selectAuditEvents(filter: AuditFilter, limit: number, offset: number): Promise<AuditRow[]> {
  const { whereSql, replacements } = filterSql(filter);
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

// SQL for speed: the distinct record types of the whole trail by a loose index scan (a recursive query
// stepping from one type to the next through audit_events_entity), a few index probes instead of a pass
// over every event of the year.
export async function selectAuditEntityTypes(): Promise<{ entityType: string }[]> {
  return db().query<{ entityType: string }>(
    `with recursive types as (
       (select entity_type from audit_events order by entity_type limit 1)
       union all
       select (select a.entity_type from audit_events a where a.entity_type > t.entity_type order by a.entity_type limit 1)
         from types t where t.entity_type is not null
     )
     select entity_type as "entityType" from types where entity_type is not null order by 1`,
    { type: QueryTypes.SELECT },
  );
}

// SQL: each person's label is put together by PostgreSQL, name and address, as plain rows.
export async function selectPeopleLabels(): Promise<{ id: string; label: string }[]> {
  return db().query<{ id: string; label: string }>(
    `select id, name || ' <' || email || '>' as label from users order by name`,
    { type: QueryTypes.SELECT },
  );
}
