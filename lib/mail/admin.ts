import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { MailMessage } from '@/models/mail-message';
import { LINK_MAIL_KINDS, type MailState } from '@/lib/domain/mail';
import { bringWaitingMailForward, countOutboxByState, selectOutbox, type OutboxRow } from './queries';

/** One message of the outbox as the admin page lists it. */
export type { OutboxRow } from './queries';

/** The newest messages of the outbox with their delivery state, optionally of one state. Admins only. */
export async function listOutbox(actor: Actor, filter: { state?: MailState } = {}): Promise<OutboxRow[]> {
  requireCapability(actor, 'manageMail');
  return selectOutbox(filter.state);
}

/** Counts by delivery state, for the page's summary line. Admins only. */
export async function outboxCounts(actor: Actor): Promise<Record<MailState, number>> {
  requireCapability(actor, 'manageMail');
  const rows = await countOutboxByState();
  return { queued: 0, sent: 0, failed: 0, ...Object.fromEntries(rows.map((r) => [r.state, r.n])) };
}

/**
 * Brings every message waiting for a later attempt forward to now, for when the SMTP server is back
 * before the next retry; messages a sender holds at this moment are left to it. Audited once, with the
 * ids. Admins only. Returns how many were brought forward.
 */
export async function hurryWaitingMail(actor: Actor): Promise<number> {
  requireCapability(actor, 'manageMail');
  return db().transaction(async (transaction) => {
    const rows = await bringWaitingMailForward(transaction);
    if (rows.length) {
      await recordAudit(
        {
          actorId: actor.id,
          action: 'hurry_mail',
          entityType: 'mail_outbox',
          after: { messages: rows.map((r) => r.id) },
          address: actor.address,
        },
        transaction,
      );
    }
    return rows.length;
  });
}

/** Puts a message that gave up back in the queue for a fresh round of attempts; audited. Admins only. */
export async function requeueMail(actor: Actor, messageId: string): Promise<void> {
  requireCapability(actor, 'manageMail');
  await db().transaction(async (transaction) => {
    const message = await MailMessage.findByPk(messageId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!message) throw new AppError('not_found', 'No such message in the outbox.');
    if (message.state !== 'failed')
      throw new AppError(
        'conflict',
        `This message is ${message.state}; only a failed message can be sent again.`,
      );
    // Its link was cut from the kept copy when it failed (lib/mail/deliver.ts), and would have run out anyway.
    if (LINK_MAIL_KINDS.includes(message.kind))
      throw new AppError(
        'conflict',
        'A password link is not sent again; the person asks for a new one on the sign-in page ("Lost your password?").',
      );
    const before = { state: message.state, attempts: message.attempts, lastError: message.lastError };
    await message.update({ state: 'queued', attempts: 0, nextAttemptAt: new Date() }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'requeue_mail',
        entityType: 'mail_message',
        entityId: message.id,
        before,
        after: { state: 'queued', toAddress: message.toAddress },
        address: actor.address,
      },
      transaction,
    );
  });
}
