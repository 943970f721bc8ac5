import 'server-only';
import { Op, type Transaction } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import type { SheetData } from '@/lib/imports/spreadsheet-types';
import { draftRecordSchema, draftSheetsSchema } from '@/lib/validation/imports';
import { ImportDraft } from '@/models';
import { consumeDraftRow, removeExpiredDraftRows } from './import-queries';

/**
 * Import drafts: inspect reads and parses an upload once and keeps it here, with its sheets as plain
 * values and its bytes, for its owner only, until it expires. Preview and commit (and the import job)
 * take the sheets from the draft and never parse again; the commit consumes it in the transaction that
 * stores the plate. The job sweep removes expired drafts (removeExpiredDrafts).
 * A draft may wait for compounds the registry lacks (markDraftWaiting, lib/compounds/waiting-imports.ts):
 * while it waits it does not expire, and it stays until it is stored or its owner discards it.
 */

/** How long a draft is kept after inspect, ms: 24 h (a common lifetime for pending uploads; no source). */
export const DRAFT_LIFETIME_MS = 24 * 60 * 60 * 1000;

/** A file read once, kept as a draft. */
export interface DraftInput {
  screenId: string;
  filename: string;
  mediaType: string;
  bytes: Uint8Array;
  sha256: string;
  sheets: SheetData[];
}

/** A draft as preview and commit use it: the file's record and its parsed sheets. */
export interface DraftFile {
  id: string;
  screenId: string;
  filename: string;
  mediaType: string;
  sha256: string;
  bytes: Uint8Array;
  sheets: SheetData[];
  expiresAt: Date;
  /** When the draft began to wait for compounds; null when it does not wait. */
  waitingSince: Date | null;
}

/** Keeps a file read at inspect as its owner's draft; returns its id and when it expires. */
export async function createDraft(
  actor: Actor,
  input: DraftInput,
  now = new Date(),
): Promise<{ id: string; expiresAt: Date }> {
  db();
  const expiresAt = new Date(now.getTime() + DRAFT_LIFETIME_MS);
  const draft = await ImportDraft.create({
    ownerId: actor.id,
    screenId: input.screenId,
    filename: input.filename,
    mediaType: input.mediaType,
    sha256: input.sha256,
    sizeBytes: input.bytes.byteLength,
    sheets: input.sheets,
    bytes: Buffer.from(input.bytes.buffer, input.bytes.byteOffset, input.bytes.byteLength),
    createdAt: now,
    expiresAt,
  });
  return { id: draft.id, expiresAt };
}

const NOT_FOUND = 'No such import draft: read the file again.';

/**
 * The actor's draft with its sheets and bytes: refused as not found when it is missing or another
 * person's, and with a message when it expired or was already stored. With a transaction the row is
 * locked, so that two commits of one draft take turns and the second is refused as used.
 */
export async function readDraft(
  actor: Actor,
  draftId: string,
  options: { transaction?: Transaction; content?: boolean } = {},
): Promise<DraftFile> {
  db();
  const { transaction } = options;
  const row = await ImportDraft.findByPk(draftId, {
    raw: true,
    ...(options.content === false ? { attributes: { exclude: ['sheets', 'bytes'] } } : {}),
    ...(transaction ? { transaction, lock: transaction.LOCK.UPDATE } : {}),
  });
  if (!row || row.ownerId !== actor.id) throw new AppError('not_found', NOT_FOUND);
  const record = draftRecordSchema.parse(row);
  if (record.consumedAt) {
    throw new AppError(
      'conflict',
      `This file was already stored as a plate from this draft; read the file again to import it anew.`,
      { draft: 'used', plateId: record.plateId },
    );
  }
  const waitingSince = row.waitingSince ?? null;
  if (!waitingSince && record.expiresAt.getTime() <= Date.now()) {
    throw new AppError(
      'conflict',
      `This import draft expired at ${record.expiresAt.toISOString()} (drafts are kept ${DRAFT_LIFETIME_MS / 3_600_000} hours); read the file again.`,
      { draft: 'expired' },
    );
  }
  if (options.content === false) return { ...record, waitingSince, bytes: new Uint8Array(), sheets: [] };
  const sheets = draftSheetsSchema.safeParse(row.sheets);
  if (!sheets.success || !row.bytes)
    throw new AppError('invalid', 'The stored draft is not readable; read the file again.');
  return {
    ...record,
    waitingSince,
    bytes: new Uint8Array(row.bytes.buffer, row.bytes.byteOffset, row.bytes.byteLength),
    sheets: sheets.data,
  };
}

/**
 * Marks the draft used by its plates (a file may hold several, the first in plate_id), dropping its sheets
 * and bytes, in the transaction that stores them.
 */
export async function consumeDraft(
  draftId: string,
  plateIds: readonly string[],
  transaction: Transaction,
): Promise<void> {
  if (!(await consumeDraftRow(draftId, plateIds, transaction)))
    throw new AppError('conflict', 'This import draft was already used; read the file again.');
}

/** The sweep's part for drafts: removes every expired draft, used or not; returns how many. */
export async function removeExpiredDrafts(): Promise<number> {
  return removeExpiredDraftRows();
}

/** What a waiting draft waits for, and the choices its owner made, to resume with. */
export interface DraftWaiting {
  waitingFor: string[];
  choice: object;
}

/** A draft waiting for compounds, without its sheets and bytes. */
export interface WaitingDraft extends DraftWaiting {
  id: string;
  ownerId: string;
  screenId: string;
  filename: string;
  waitingSince: Date;
}

/** Marks the draft (read under its lock in this transaction) as waiting for these compounds. */
export async function markDraftWaiting(
  draftId: string,
  waiting: DraftWaiting,
  transaction: Transaction,
  now = new Date(),
): Promise<void> {
  await ImportDraft.update(
    { waitingSince: now, waitingFor: waiting.waitingFor, waitingChoice: waiting.choice },
    { where: { id: draftId }, transaction },
  );
}

/** Every draft still waiting for compounds (not stored yet), oldest first; only the owner's when given. */
export async function listWaitingDrafts(
  filter: { ownerId?: string; ids?: string[] } = {},
  transaction?: Transaction,
): Promise<WaitingDraft[]> {
  db();
  const rows = await ImportDraft.findAll({
    attributes: ['id', 'ownerId', 'screenId', 'filename', 'waitingSince', 'waitingFor', 'waitingChoice'],
    where: {
      waitingSince: { [Op.ne]: null },
      consumedAt: null,
      ...(filter.ownerId ? { ownerId: filter.ownerId } : {}),
      ...(filter.ids ? { id: filter.ids } : {}),
    },
    order: [['waitingSince', 'ASC']],
    raw: true,
    ...(transaction ? { transaction } : {}),
  });
  return rows.map((r) => ({
    id: r.id,
    ownerId: r.ownerId,
    screenId: r.screenId,
    filename: r.filename,
    waitingSince: r.waitingSince!,
    waitingFor: r.waitingFor ?? [],
    choice: r.waitingChoice ?? {},
  }));
}

/** Removes a draft its owner gives up (read under its lock in this transaction). */
export async function removeDraft(draftId: string, transaction: Transaction): Promise<void> {
  await ImportDraft.destroy({ where: { id: draftId }, transaction });
}
