import 'server-only';
import { claimDueMail, markMailAttemptFailed, markMailSent, type ClaimedMail } from './queries';
import { smtpSettingsFromEnv, smtpTransport, type SmtpSettings } from './transport';

/** How long a claimed message stays reserved for the process sending it; after that another may retry it. */
const LEASE_MS = 5 * 60_000;
const FIRST_RETRY_MS = 60_000;
const LONGEST_RETRY_MS = 60 * 60_000;

/** Wait after the n-th failed attempt: 1, 2, 4, … minutes, at most an hour. */
export function retryDelayMs(attempts: number): number {
  return Math.min(FIRST_RETRY_MS * 2 ** Math.max(attempts - 1, 0), LONGEST_RETRY_MS);
}

/** nodemailer's codes for a server that cannot be reached at all (as opposed to one message refused). */
const CONNECTION_CODES = new Set(['ECONNECTION', 'ETIMEDOUT', 'ESOCKET', 'EDNS', 'ETLS']);

export interface DeliveryOptions {
  /** SMTP server to use; the deployment's SMTP_* settings by default. */
  smtp?: SmtpSettings;
  /** The clock, for tests of the backoff. @default new Date() */
  now?: Date;
  /** Most messages claimed in one run. @default 50 */
  limit?: number;
}

export interface DeliveryReport {
  attempted: number;
  sent: number;
  retrying: number;
  failed: number;
}

/**
 * Reserves due messages (skipping any another process holds), counting the attempt before it is made.
 * The claim ends at the lease's end (claimed_until); a sender that dies leaves the message due then.
 */
async function claimDue(now: Date, limit: number): Promise<ClaimedMail[]> {
  return claimDueMail(now, new Date(now.getTime() + LEASE_MS), limit);
}

/** Records an attempt's outcome; once a message has gone out (or never will), a password link in it is cut from the kept copy. */
async function settle(
  id: string,
  outcome: { sent: true; response: string } | { sent: false; error: string; giveUp: boolean; retryAt: Date },
) {
  if (outcome.sent) await markMailSent(id, outcome.response.slice(0, 500));
  else
    await markMailAttemptFailed(id, {
      state: outcome.giveUp ? 'failed' : 'queued',
      retryAt: outcome.retryAt,
      error: outcome.error.slice(0, 500),
    });
}

/**
 * Sends every queued message that is due, through nodemailer over SMTP. A failed attempt is kept with its
 * error and retried after a growing wait; after the message's last attempt it is marked failed. Several
 * processes may run this at once: each message is claimed by one of them.
 */
export async function deliverDueMail(options: DeliveryOptions = {}): Promise<DeliveryReport> {
  const now = options.now ?? new Date();
  const due = await claimDue(now, options.limit ?? 50);
  const report: DeliveryReport = { attempted: due.length, sent: 0, retrying: 0, failed: 0 };
  if (!due.length) return report;
  const settings = options.smtp ?? smtpSettingsFromEnv();
  const transport = smtpTransport(settings);
  let unreachable: string | null = null;
  try {
    for (const message of due) {
      try {
        // Once the server cannot be reached, the rest of this run's messages wait for their retry too.
        if (unreachable) throw new Error(unreachable);
        const info = await transport.sendMail({
          from: settings.from,
          to: message.toAddress,
          subject: message.subject,
          text: message.bodyText,
          messageId: `<${message.id}@gatewell>`,
          headers: { 'X-Gatewell-Outbox-Id': message.id },
        });
        if (info.rejected.length) throw new Error(`recipient refused: ${info.response}`);
        await settle(message.id, { sent: true, response: info.response });
        report.sent++;
      } catch (error) {
        const giveUp = message.attempts >= message.maxAttempts;
        const text = error instanceof Error ? error.message : String(error);
        if (CONNECTION_CODES.has((error as { code?: string }).code ?? '')) unreachable = text;
        await settle(message.id, {
          sent: false,
          error: text,
          giveUp,
          retryAt: new Date(now.getTime() + retryDelayMs(message.attempts)),
        });
        if (giveUp) report.failed++;
        else report.retrying++;
      }
    }
  } finally {
    transport.close();
  }
  return report;
}
