import 'server-only';
import { QueryTypes } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { LINK_MAIL_KINDS, MailMessage, type MailKind, type MailState } from '@/models/mail-message';

/** One message of the outbox as the admin page lists it. */
export interface OutboxRow {
  id: string;
  kind: MailKind;
  plateId: string | null;
  plateLabel: string | null;
  toAddress: string;
  recipientName: string;
  subject: string;
  state: MailState;
  attempts: number;
  maxAttempts: number;
  createdAt: string;
  nextAttemptAt: string | null;
  sentAt: string | null;
  lastError: string | null;
  smtpResponse: string | null;
}

const iso = (column: string) => `to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"')`;

/** The newest messages of the outbox with their delivery state, optionally of one state. Admins only. */
export async function listOutbox(actor: Actor, filter: { state?: MailState } = {}): Promise<OutboxRow[]> {
  requireCapability(actor, 'manageMail');
  return db().query<OutboxRow>(
    `select m.id, m.kind, m.plate_id as "plateId", p.label as "plateLabel", m.to_address as "toAddress", u.name as "recipientName", m.subject, m.state,
            m.attempts, m.max_attempts as "maxAttempts", ${iso('m.created_at')} as "createdAt",
            case when m.state = 'queued' then ${iso('m.next_attempt_at')} end as "nextAttemptAt", ${iso('m.sent_at')} as "sentAt",
            m.last_error as "lastError", m.smtp_response as "smtpResponse"
       from mail_outbox m join users u on u.id = m.recipient_id left join plates p on p.id = m.plate_id
      ${filter.state ? 'where m.state = :state' : ''}
      order by m.created_at desc, m.to_address
      limit 300`,
    { type: QueryTypes.SELECT, replacements: { state: filter.state ?? null } },
  );
}

/** Counts by delivery state, for the page's summary line. Admins only. */
export async function outboxCounts(actor: Actor): Promise<Record<MailState, number>> {
  requireCapability(actor, 'manageMail');
  const rows = await db().query<{ state: MailState; n: number }>('select state, count(*)::int as n from mail_outbox group by state', { type: QueryTypes.SELECT });
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
    const rows = await db().query<{ id: string }>(
      `update mail_outbox set next_attempt_at = now()
        where state = 'queued' and next_attempt_at > now() and (claimed_until is null or claimed_until <= now())
        returning id`,
      { type: QueryTypes.SELECT, transaction },
    );
    if (rows.length) {
      await recordAudit({ actorId: actor.id, action: 'hurry_mail', entityType: 'mail_outbox', after: { messages: rows.map((r) => r.id) }, address: actor.address }, transaction);
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
    if (message.state !== 'failed') throw new AppError('conflict', `This message is ${message.state}; only a failed message can be sent again.`);
    // Its link was cut from the kept copy when it failed (lib/mail/deliver.ts), and would have run out anyway.
    if (LINK_MAIL_KINDS.includes(message.kind)) throw new AppError('conflict', 'A password link is not sent again; the person asks for a new one on the sign-in page ("Lost your password?").');
    const before = { state: message.state, attempts: message.attempts, lastError: message.lastError };
    await message.update({ state: 'queued', attempts: 0, nextAttemptAt: new Date() }, { transaction });
    await recordAudit({ actorId: actor.id, action: 'requeue_mail', entityType: 'mail_message', entityId: message.id, before, after: { state: 'queued', toAddress: message.toAddress }, address: actor.address }, transaction);
  });
}
