import 'server-only';
import type { Transaction } from 'sequelize';
import { MailMessage } from '@/models/mail-message';
import { type MailKind } from '@/lib/domain/mail';

export interface OutgoingMail {
  kind: MailKind;
  plateId: string | null;
  signoffEventId: string | null;
  recipientId: string;
  toAddress: string;
  subject: string;
  bodyText: string;
  /** Attempts before the message is marked failed; MAX_ATTEMPTS unless the message is worth less later. */
  maxAttempts?: number;
}

/** Most attempts before a message is marked failed (about three hours with the backoff of deliver.ts). */
export const MAX_ATTEMPTS = 8;

/**
 * Queues notifications in the caller's transaction: they exist exactly when the change that caused them
 * commits, and the sender delivers them afterwards, so an unreachable mail server never undoes a change.
 */
export async function queueMail(messages: OutgoingMail[], transaction: Transaction): Promise<number> {
  if (!messages.length) return 0;
  await MailMessage.bulkCreate(
    messages.map((m) => ({ ...m, maxAttempts: m.maxAttempts ?? MAX_ATTEMPTS })),
    { transaction },
  );
  return messages.length;
}
