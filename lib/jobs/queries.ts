import 'server-only';
import type pg from 'pg';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';

/**
 * The SQL of the job queue, each statement in a named function with the reason it is SQL. The one
 * statement left outside is in lib/jobs/background-priority.ts: lib/db.ts runs it on each new
 * connection, before any model exists, and a module that imports lib/db cannot be imported there.
 */

/** pg-boss keeps its jobs in a schema of its own, which no Gatewell model maps. */
export const QUEUE_SCHEMA = 'pgboss';

/** Serialises enqueues of one key until the transaction ends. SQL: an advisory lock has no model call. */
export async function lockJobKey(key: string, transaction: Transaction): Promise<void> {
  await db().query('select pg_advisory_xact_lock(hashtextextended(:key, 0))', {
    replacements: { key: `job:${key}` },
    transaction,
  });
}

/** Notifies listeners on the channel when the transaction commits. SQL: NOTIFY has no model call. */
export async function notifyChannel(
  channel: string,
  payload: string,
  transaction: Transaction,
): Promise<void> {
  await db().query('select pg_notify(:channel, :payload)', {
    replacements: { channel, payload },
    transaction,
  });
}

/** Starts listening on the channel over the client's own connection. SQL: LISTEN belongs to that raw pg connection, not Sequelize's pool. */
export async function listenOn(client: pg.Client, channel: string): Promise<void> {
  await client.query(`listen ${client.escapeIdentifier(channel)}`);
}

/**
 * Marks failed every open compute_jobs row (older than 30 s) whose queue job has ended; returns how many.
 * SQL: it reads pg-boss's own job table, which no model maps, in one statement.
 */
export async function closeJobsEndedOnQueue(): Promise<number> {
  const [, closed] = await db().query(
    `update compute_jobs c set state = 'failed', finished_at = now(),
            message = 'The job ended on the queue without finishing (its worker stopped or it ran out of time).'
      where c.state in ('queued', 'running') and c.created_at < now() - interval '30 seconds'
        and not exists (select 1 from ${QUEUE_SCHEMA}.job j where j.id = c.id and j.state in ('created', 'retry', 'active'))`,
    { type: QueryTypes.UPDATE },
  );
  return Number(closed ?? 0);
}

/** Plates whose fits wait with no fit job open. SQL: one anti-join in the database instead of every pending plate's jobs read back. */
export async function platesWithoutOpenRefit(): Promise<string[]> {
  const rows = await db().query<{ id: string }>(
    `select p.id from plates p
      where p.fits_pending
        and not exists (select 1 from compute_jobs j where j.plate_id = p.id and j.kind = 'plate-fits' and j.state in ('queued', 'running'))`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((row) => row.id);
}
