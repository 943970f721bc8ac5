import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';

/** The compute_jobs key of an upload's import job. */
export const importJobKey = (uploadId: string): string => `plate-import:${uploadId}`;

/**
 * Removes the upload unless a worker holds it; true when it was removed here.
 * SQL: "skip locked" in one statement, so that a worker's row lock answers at once instead of blocking.
 */
export async function removeUploadNoWorkerHolds(uploadId: string): Promise<boolean> {
  const removed = await db().query<{ id: string }>(
    'delete from import_uploads where id in (select id from import_uploads where id = :id for update skip locked) returning id',
    { type: QueryTypes.SELECT, replacements: { id: uploadId } },
  );
  return removed.length > 0;
}

/**
 * Removes every upload whose import job has ended (a worker stopped, the database went away); the key
 * is importJobKey's. SQL: one anti-join on the job key in the database, instead of reading every upload
 * and its job back.
 */
export async function removeUploadsOfEndedJobs(): Promise<void> {
  await db().query(
    `delete from import_uploads u
      where not exists (select 1 from compute_jobs c where c.job_key = 'plate-import:' || u.id::text and c.state in ('queued', 'running'))`,
  );
}

/**
 * Marks a draft used by the plate and drops its sheets and bytes (the plate's file record keeps the
 * bytes); true when it was still unused. The caller's transaction also stores the plate.
 */
export async function consumeDraftRow(
  draftId: string,
  plateIds: readonly string[],
  transaction: Transaction,
): Promise<boolean> {
  const used = await db().query<{ id: string }>(
    `update import_drafts set consumed_at = now(), plate_id = :plateId, plate_ids = :plateIds::uuid[],
        sheets = null, bytes = null
      where id = :draftId and consumed_at is null returning id`,
    {
      type: QueryTypes.SELECT,
      replacements: { draftId, plateId: plateIds[0]!, plateIds: `{${plateIds.join(',')}}` },
      transaction,
    },
  );
  return used.length > 0;
}

/**
 * Removes every draft past its expiry, used or not (a queued commit of one goes with it), except those
 * still waiting for compounds; returns how many.
 */
export async function removeExpiredDraftRows(): Promise<number> {
  const removed = await db().query<{ id: string }>(
    'delete from import_drafts where expires_at <= now() and (waiting_since is null or consumed_at is not null) returning id',
    { type: QueryTypes.SELECT },
  );
  return removed.length;
}
