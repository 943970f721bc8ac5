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
  /** The person's roles today, comma-separated (audit events do not keep the roles of their moment). */
  actorRoles: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  /** The object in words: plate label, compound identifier, well and plate, screen name, person… */
  objectName: string | null;
  reason: string | null;
  before: unknown;
  after: unknown;
  address: string | null;
}

const UUID_TEXT = `'^[0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{12}$'`;
/** The event's object id as a uuid when it is one, else null (entity_id is text). */
const OBJECT_UUID = `(case when a.entity_id ~ ${UUID_TEXT} then a.entity_id::uuid end)`;

/** The filter as SQL conditions on `audit_events a`. */
function filterSql(filter: AuditFilter): { whereSql: string; replacements: Record<string, unknown> } {
  const where: string[] = [];
  const replacements: Record<string, unknown> = {};
  const clauses: [keyof typeof filter, string][] = [
    ['entityType', 'a.entity_type = :entityType'],
    ['entityId', 'a.entity_id = :entityId'],
    ['action', 'a.action = :action'],
    ['userId', 'a.actor_id = :userId'],
    // A plate by label: the plate's own events and those of its wells.
    [
      'plate',
      `(a.entity_type = 'plate' and a.entity_id in (select id::text from plates where lower(label) = lower(:plate)))
        or (a.entity_type = 'well' and a.entity_id in (select w.id::text from wells w join plates p on p.id = w.plate_id where lower(p.label) = lower(:plate)))`,
    ],
    // A compound by identifier: its own events, its batches' and aliases', and fit choices naming it.
    [
      'compound',
      `(a.entity_type = 'compound' and a.entity_id in (select id::text from compounds where lower(identifier) = lower(:compound)))
        or (a.entity_type = 'batch' and a.entity_id in (select b.id::text from batches b join compounds c on c.id = b.compound_id where lower(c.identifier) = lower(:compound)))
        or (a.entity_type = 'compound_alias' and a.entity_id in (select ca.id::text from compound_aliases ca join compounds c on c.id = ca.compound_id where lower(c.identifier) = lower(:compound)))
        or (a.entity_type = 'plate' and a.after ->> 'compoundId' in (select id::text from compounds where lower(identifier) = lower(:compound)))`,
    ],
    ['from', 'a.occurred_at >= :from'],
    ['to', 'a.occurred_at < :to'],
  ];
  for (const [key, sql] of clauses) {
    if (filter[key] === undefined) continue;
    where.push(`(${sql})`);
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

// SQL for speed: events matching the filter, newest first, with the acting person and their roles, the
// object's name joined from its own table (one query for the page), times as UTC text to the millisecond.
export function selectAuditEvents(filter: AuditFilter, limit: number, offset: number): Promise<AuditRow[]> {
  const { whereSql, replacements } = filterSql(filter);
  return db().query<AuditRow>(
    `with page as (
       select a.* from audit_events a
        ${whereSql}
        order by a.occurred_at desc, a.id desc
        limit :limit offset :offset
     )
     select a.id, to_char(a.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as "occurredAt",
            a.actor_id as "actorId", u.name as "actorName", u.email as "actorEmail",
            (select string_agg(r.role, ', ' order by r.role) from user_roles r where r.user_id = a.actor_id) as "actorRoles",
            a.action, a.entity_type as "entityType", a.entity_id as "entityId",
            case a.entity_type
              when 'plate' then p.label
              when 'well' then wl.position || ' on ' || wp.label
              when 'compound' then c.identifier
              when 'batch' then bc.identifier || ' lot ' || b.lot
              when 'compound_alias' then ca.alias || ' (alias of ' || cac.identifier || ')'
              when 'screen' then s.name
              when 'target' then t.name || ' (' || ts.name || ')'
              when 'import_template' then it.name
              when 'import_draft' then d.filename
              when 'user' then ou.name
              when 'session' then coalesce(ou.name, a.after ->> 'email')
              when 'mail_message' then m.subject || ' to ' || m.to_address
            end as "objectName",
            a.reason, a.before, a.after, a.address
       from page a
       left join users u on u.id = a.actor_id
       left join plates p on a.entity_type = 'plate' and p.id = ${OBJECT_UUID}
       left join wells wl on a.entity_type = 'well' and wl.id = ${OBJECT_UUID}
       left join plates wp on wp.id = wl.plate_id
       left join compounds c on a.entity_type = 'compound' and c.id = ${OBJECT_UUID}
       left join batches b on a.entity_type = 'batch' and b.id = ${OBJECT_UUID}
       left join compounds bc on bc.id = b.compound_id
       left join compound_aliases ca on a.entity_type = 'compound_alias' and ca.id = ${OBJECT_UUID}
       left join compounds cac on cac.id = ca.compound_id
       left join screens s on a.entity_type = 'screen' and s.id = ${OBJECT_UUID}
       left join targets t on a.entity_type = 'target' and t.id = ${OBJECT_UUID}
       left join screens ts on ts.id = t.screen_id
       left join import_templates it on a.entity_type = 'import_template' and it.id = ${OBJECT_UUID}
       left join import_drafts d on a.entity_type = 'import_draft' and d.id = ${OBJECT_UUID}
       left join users ou on a.entity_type in ('user', 'session') and ou.id = ${OBJECT_UUID}
       left join mail_outbox m on a.entity_type = 'mail_message' and m.id = ${OBJECT_UUID}
      order by a.occurred_at desc, a.id desc`,
    { type: QueryTypes.SELECT, replacements: { ...replacements, limit, offset } },
  );
}

// SQL: the names of plates, compounds, screens, targets and people among the given ids, in one query
// (the ids an page's before and after values refer to).
export async function selectNamesOf(ids: string[]): Promise<{ id: string; name: string }[]> {
  if (!ids.length) return [];
  return db().query<{ id: string; name: string }>(
    `with wanted as (select unnest(cast(:ids as uuid[])) as id)
     select p.id::text as id, p.label as name from plates p join wanted using (id)
     union all select c.id::text, c.identifier from compounds c join wanted using (id)
     union all select s.id::text, s.name from screens s join wanted using (id)
     union all select t.id::text, t.name from targets t join wanted using (id)
     union all select u.id::text, u.name from users u join wanted using (id)`,
    { type: QueryTypes.SELECT, replacements: { ids: `{${ids.join(',')}}` } },
  );
}

// SQL: plate labels holding the text, newest import first, grouped by label (a pass over the plates'
// labels: 5,000 rows for a year of screening).
export async function selectPlateLabelsLike(text: string, limit: number): Promise<string[]> {
  const rows = await db().query<{ label: string }>(
    `select label from plates where strpos(lower(label), lower(:text)) > 0
      group by label order by max(imported_at) desc limit :limit`,
    { type: QueryTypes.SELECT, replacements: { text, limit } },
  );
  return rows.map((r) => r.label);
}

// SQL: a substring match on identifiers, case-insensitive, in the registry's order.
export async function selectCompoundIdentifiersLike(text: string, limit: number): Promise<string[]> {
  const rows = await db().query<{ identifier: string }>(
    `select identifier from compounds where strpos(lower(identifier), lower(:text)) > 0
      order by identifier limit :limit`,
    { type: QueryTypes.SELECT, replacements: { text, limit } },
  );
  return rows.map((r) => r.identifier);
}

// SQL for speed: the distinct values of one indexed column of the whole trail by a loose index scan (a
// recursive query stepping from one value to the next through the column's index, audit_events_action or
// audit_events_entity), a few index probes instead of a pass over every event of the year.
async function distinctAuditValues(column: 'action' | 'entity_type'): Promise<string[]> {
  const rows = await db().query<{ value: string }>(
    `with recursive steps as (
       (select ${column} as value from audit_events order by ${column} limit 1)
       union all
       select (select a.${column} from audit_events a where a.${column} > t.value order by a.${column} limit 1)
         from steps t where t.value is not null
     )
     select value from steps where value is not null order by value`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((row) => row.value);
}

/** The distinct kinds of event of the whole trail. */
export async function selectAuditActions(): Promise<{ action: string }[]> {
  return (await distinctAuditValues('action')).map((action) => ({ action }));
}

/** The distinct record types of the whole trail. */
export async function selectAuditEntityTypes(): Promise<{ entityType: string }[]> {
  return (await distinctAuditValues('entity_type')).map((entityType) => ({ entityType }));
}

// SQL: each person's label is put together by PostgreSQL, name and address, as plain rows.
export async function selectPeopleLabels(): Promise<{ id: string; label: string }[]> {
  return db().query<{ id: string; label: string }>(
    `select id, name || ' <' || email || '>' as label from users order by name`,
    { type: QueryTypes.SELECT },
  );
}
