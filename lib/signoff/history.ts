import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';

/** One event of a plate's history: an audit event, with its signature when it is one. */
export interface HistoryEntry {
  id: number;
  occurredAt: string;
  actorName: string | null;
  action: string;
  entityType: string;
  /** Well position, for events of one of the plate's wells. */
  wellPosition: string | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  signature: { meaning: string; comment: string; contentSha256: string; signedAt: string } | null;
}

type Row = Omit<HistoryEntry, 'signature'> & { meaning: string | null; comment: string | null; contentSha256: string | null; signedAt: string | null };

/**
 * Every audit event of the plate and of its wells, in the order they were written (the audit id), each
 * signature with its meaning, comment and the SHA-256 of the data it covers. Every signed-in role may read it.
 */
export async function plateHistory(actor: Actor, plateId: string): Promise<HistoryEntry[]> {
  void actor; // every signed-in role may read plates
  const sequelize = db();
  const [plate] = await sequelize.query('select 1 from plates where id = :plateId', { type: QueryTypes.SELECT, replacements: { plateId } });
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const rows = await sequelize.query<Row>(
    `select a.id, to_char(a.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "occurredAt", u.name as "actorName", a.action,
            a.entity_type as "entityType", w.position as "wellPosition", a.reason, a.before, a.after,
            s.meaning, s.comment, s.content_sha256 as "contentSha256", to_char(s.signed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "signedAt"
       from audit_events a
       left join users u on u.id = a.actor_id
       left join wells w on a.entity_type = 'well' and w.plate_id = :plateId and w.id::text = a.entity_id
       left join signatures s on a.action = 'sign' and s.id::text = a.after ->> 'signatureId'
      where (a.entity_type = 'plate' and a.entity_id = :plateId)
         or (a.entity_type = 'well' and a.entity_id in (select id::text from wells where plate_id = :plateId))
      order by a.id`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return rows.map(({ meaning, comment, contentSha256, signedAt, ...entry }) => ({
    ...entry,
    signature: meaning !== null && contentSha256 !== null ? { meaning, comment: comment ?? '', contentSha256, signedAt: signedAt ?? entry.occurredAt } : null,
  }));
}
