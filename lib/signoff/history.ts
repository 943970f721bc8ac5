import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { Plate } from '@/models';
import { selectPlateHistory, type HistoryRow } from './queries';

/** One event of a plate's history: an audit event, with its signature when it is one. */
export interface HistoryEntry extends Omit<HistoryRow, 'meaning' | 'comment' | 'contentSha256' | 'signedAt'> {
  signature: { meaning: string; comment: string; contentSha256: string; signedAt: string } | null;
}

/**
 * Every audit event of the plate and of its wells, in the order they were written (the audit id), each
 * signature with its meaning, comment and the SHA-256 of the data it covers. Every signed-in role may read it.
 */
export async function plateHistory(actor: Actor, plateId: string): Promise<HistoryEntry[]> {
  void actor; // every signed-in role may read plates
  db();
  const plate = await Plate.findByPk(plateId, { attributes: ['id'], raw: true });
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const rows = await selectPlateHistory(plateId);
  return rows.map(({ meaning, comment, contentSha256, signedAt, ...entry }) => ({
    ...entry,
    signature:
      meaning !== null && contentSha256 !== null
        ? { meaning, comment: comment ?? '', contentSha256, signedAt: signedAt ?? entry.occurredAt }
        : null,
  }));
}
