import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';
import { LINK_MAIL_KINDS, type MailKind, type MailState } from '@/lib/domain/mail';

export interface ClaimedMail {
  id: string;
  toAddress: string;
  subject: string;
  bodyText: string;
  attempts: number;
  maxAttempts: number;
}

// SQL for a row lock: claims due messages with `for update skip locked` and counts the attempt in one statement.
export async function claimDueMail(now: Date, leaseEnd: Date, limit: number): Promise<ClaimedMail[]> {
  return db().query<ClaimedMail>(
    `update mail_outbox m set attempts = m.attempts + 1, last_attempt_at = :now, next_attempt_at = :leaseEnd, claimed_until = :leaseEnd
      where m.id in (select id from mail_outbox where state = 'queued' and next_attempt_at <= :now
                      order by next_attempt_at, created_at limit :limit for update skip locked)
      returning m.id, m.to_address as "toAddress", m.subject, m.body_text as "bodyText", m.attempts, m.max_attempts as "maxAttempts"`,
    { type: QueryTypes.SELECT, replacements: { now, leaseEnd, limit } },
  );
}

/**
 * Once a message has gone out (or will never go), a password link in it is cut from the kept copy: the
 * outbox keeps what was sent, not a key that still opens the account (lib/auth/password-link.ts).
 */
const REDACTED_BODY_VALUE = `case when kind in (${LINK_MAIL_KINDS.map((kind) => `'${kind}'`).join(', ')}) then regexp_replace(body_text, '/password-link/[A-Za-z0-9_-]+', '/password-link/(removed once sent)', 'g') else body_text end`;
const REDACTED_BODY = `body_text = ${REDACTED_BODY_VALUE}`;

// SQL: the link is cut from the kept body by regexp_replace in the same update, with the database's clock for sent_at.
export async function markMailSent(id: string, response: string): Promise<void> {
  await db().query(
    `update mail_outbox set state = 'sent', sent_at = now(), smtp_response = :response, last_error = null, claimed_until = null, ${REDACTED_BODY} where id = :id`,
    {
      replacements: { id, response },
    },
  );
}

// SQL: on giving up the link is cut from the kept body by regexp_replace in the same update.
export async function markMailAttemptFailed(
  id: string,
  failure: { state: 'failed' | 'queued'; retryAt: Date; error: string },
): Promise<void> {
  await db().query(
    `update mail_outbox set state = :state, next_attempt_at = :retryAt, last_error = :error, claimed_until = null,
      body_text = case when :state = 'failed' then ${REDACTED_BODY_VALUE} else body_text end where id = :id`,
    {
      replacements: { id, ...failure },
    },
  );
}

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

// SQL for speed: the newest 300 messages with recipient and plate in one query, times written as UTC text by PostgreSQL.
export async function selectOutbox(state: MailState | undefined): Promise<OutboxRow[]> {
  return db().query<OutboxRow>(
    `select m.id, m.kind, m.plate_id as "plateId", p.label as "plateLabel", m.to_address as "toAddress", u.name as "recipientName", m.subject, m.state,
            m.attempts, m.max_attempts as "maxAttempts", ${iso('m.created_at')} as "createdAt",
            case when m.state = 'queued' then ${iso('m.next_attempt_at')} end as "nextAttemptAt", ${iso('m.sent_at')} as "sentAt",
            m.last_error as "lastError", m.smtp_response as "smtpResponse"
       from mail_outbox m join users u on u.id = m.recipient_id left join plates p on p.id = m.plate_id
      ${state ? 'where m.state = :state' : ''}
      order by m.created_at desc, m.to_address
      limit 300`,
    { type: QueryTypes.SELECT, replacements: { state: state ?? null } },
  );
}

// SQL: an aggregate, the number of messages per state, as plain rows.
export async function countOutboxByState(): Promise<{ state: MailState; n: number }[]> {
  return db().query<{ state: MailState; n: number }>(
    'select state, count(*)::int as n from mail_outbox group by state',
    { type: QueryTypes.SELECT },
  );
}

// SQL: one update by the database's clock that returns the ids it moved, in the caller's transaction.
export async function bringWaitingMailForward(transaction: Transaction): Promise<{ id: string }[]> {
  return db().query<{ id: string }>(
    `update mail_outbox set next_attempt_at = now()
        where state = 'queued' and next_attempt_at > now() and (claimed_until is null or claimed_until <= now())
        returning id`,
    { type: QueryTypes.SELECT, transaction },
  );
}
