import 'server-only';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { db } from '@/lib/db';
import { env } from '@/lib/env';
import { AppError } from '@/lib/errors';
import { queueMail } from '@/lib/mail/outbox';
import { parseOrRefuse } from '@/lib/validation/parse';
import {
  passwordLinkRequestSchema,
  setPasswordByLinkSchema,
  type SetPasswordByLinkInput,
} from '@/lib/validation/password-link';
import { PasswordLink, User } from '@/models';
import { hashPassword } from './passwords';
import { countRecentLinkRequests, expireUnusedLinks, insertLinkWithToken } from './queries';

/** How long a link asked for on the sign-in page works (common practice, no source). */
export const LINK_LIFETIME_MS = 30 * 60 * 1000;
/** How long the link of a new account's invitation works (common practice, no source). */
export const INVITATION_LIFETIME_MS = 3 * 24 * 60 * 60 * 1000;
/** Links sent to one address within the window; later requests send nothing (common practice, no source). */
export const MAX_LINKS_PER_EMAIL = 3;
/** Requests taken from one client address within the window (common practice, no source). */
export const MAX_REQUESTS_PER_ADDRESS = 10;
export const LINK_WINDOW_MS = 15 * 60 * 1000;
/** Sending attempts of a link's mail: after its retries (about 7 minutes) the link is near its end anyway. */
const LINK_MAIL_ATTEMPTS = 3;

/** The path a link opens, holding its token. */
export const passwordLinkPath = (token: string) => `/password-link/${token}`;

const sha256 = (token: string) => createHash('sha256').update(token, 'utf8').digest();

export type LinkRequestResult = { ok: true } | { ok: false; reason: 'throttled' };

/**
 * Someone asks for a link to choose a new password. For an active account (and fewer than
 * MAX_LINKS_PER_EMAIL links to it within the window) a single-use link is made and its mail queued in
 * the same transaction; earlier unused links of the account stop working. Unknown and disabled
 * addresses get the same answer and no mail, so the answer tells nobody whether an account exists.
 * Every request is kept and audited. Only a client address that asks too often is told so.
 */
export async function requestPasswordLink(
  raw: { email: unknown },
  address: string,
): Promise<LinkRequestResult> {
  const { email } = parseOrRefuse(passwordLinkRequestSchema, raw);
  const sequelize = db();
  const since = new Date(Date.now() - LINK_WINDOW_MS);
  const counts = await countRecentLinkRequests(address, email, since);
  if (counts.byAddress >= MAX_REQUESTS_PER_ADDRESS) {
    await sequelize.transaction((transaction) =>
      recordAudit(
        {
          actorId: null,
          action: 'password_link_throttled',
          entityType: 'session',
          after: { email },
          address,
        },
        transaction,
      ),
    );
    return { ok: false, reason: 'throttled' };
  }

  await sequelize.transaction(async (transaction) => {
    const user = await User.findOne({ where: { email }, transaction, lock: transaction.LOCK.UPDATE });
    const sends = Boolean(user && !user.disabledAt && counts.linksToEmail < MAX_LINKS_PER_EMAIL);
    const linkId =
      sends && user
        ? await issuePasswordLink(user, { purpose: 'lost-password', address }, transaction)
        : await recordRequestWithoutLink(email, address, transaction);
    // The record says what happened (an admin reading the trail sees whether a link went out), never the token.
    await recordAudit(
      {
        actorId: null,
        action: 'password_link_requested',
        entityType: 'user',
        entityId: sends && user ? user.id : null,
        after: {
          email,
          linkId,
          sent: sends,
          why: sends
            ? null
            : !user
              ? 'no such account'
              : user.disabledAt
                ? 'account disabled'
                : 'too many links to this address',
        },
        address,
      },
      transaction,
    );
  });
  return { ok: true };
}

async function recordRequestWithoutLink(
  email: string,
  address: string,
  transaction: Transaction,
): Promise<string> {
  const id = randomUUID();
  await PasswordLink.create({ id, email, address }, { transaction });
  return id;
}

/** Why a link is sent: a person asked on the sign-in page, or an admin created their account. */
export type LinkPurpose =
  | { purpose: 'lost-password'; address: string }
  | { purpose: 'invitation'; address: string; invitedBy: { name: string }; roles: string[] };

/**
 * Makes a single-use link for an account and queues its mail, in the caller's transaction; the account's
 * earlier unused links stop working. The link is never older than the account's password (a link made
 * with a new account, whose password time the app's clock set, must not look older than it).
 */
export async function issuePasswordLink(
  user: User,
  why: LinkPurpose,
  transaction: Transaction,
): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  const id = randomUUID();
  const lifetimeMs = why.purpose === 'invitation' ? INVITATION_LIFETIME_MS : LINK_LIFETIME_MS;
  // A newer link replaces the ones before it.
  await expireUnusedLinks(user.id, transaction);
  const { requestedAt } = await insertLinkWithToken(
    {
      id,
      email: user.email,
      userId: user.id,
      tokenSha256: sha256(token),
      lifetimeMs,
      address: why.address,
      passwordChangedAt: user.passwordChangedAt ?? new Date(0),
    },
    transaction,
  );
  await queueLinkMail(user, token, why, requestedAt, lifetimeMs, transaction);
  return id;
}

function linkMailText(
  user: User,
  link: string,
  why: LinkPurpose,
  requestedAt: Date,
  lifetimeMs: number,
): { subject: string; lines: string[] } {
  const within =
    lifetimeMs >= 24 * 60 * 60 * 1000
      ? `${lifetimeMs / (24 * 60 * 60 * 1000)} days`
      : `${lifetimeMs / 60_000} minutes`;
  if (why.purpose === 'invitation') {
    return {
      subject: 'Gatewell: your account, and a link to choose your password',
      lines: [
        `${why.invitedBy.name} made a Gatewell account for you: ${user.email}, ${why.roles.length ? `as ${why.roles.join(', ')}` : 'to read results'}.`,
        '',
        `Choose your password here within ${within}; the link works once:`,
        link,
        '',
        `Afterwards you sign in at ${env().APP_URL.replace(/\/$/, '')}/sign-in. If the link has run out, "Lost your password?" there sends a new one.`,
      ],
    };
  }
  return {
    subject: 'Gatewell: choose a new password',
    lines: [
      `Someone asked Gatewell for a link to choose a new password for ${user.email} (from ${why.address}, ${requestedAt.toISOString()}).`,
      '',
      `Choose your new password here within ${within}; the link works once:`,
      link,
      '',
      'If you did not ask, ignore this message: your password stays as it is.',
    ],
  };
}

async function queueLinkMail(
  user: User,
  token: string,
  why: LinkPurpose,
  requestedAt: Date,
  lifetimeMs: number,
  transaction: Transaction,
): Promise<void> {
  const link = `${env().APP_URL.replace(/\/$/, '')}${passwordLinkPath(token)}`;
  const { subject, lines } = linkMailText(user, link, why, requestedAt, lifetimeMs);
  await queueMail(
    [
      {
        kind: why.purpose === 'invitation' ? 'account_invitation' : 'password_link',
        plateId: null,
        signoffEventId: null,
        recipientId: user.id,
        toAddress: user.email,
        subject,
        // A lost-password link is worth little after its retries; an invitation keeps the usual attempts.
        ...(why.purpose === 'lost-password' ? { maxAttempts: LINK_MAIL_ATTEMPTS } : {}),
        bodyText: [`Hello ${user.name},`, '', ...lines, '', 'Gatewell'].join('\n'),
      },
    ],
    transaction,
  );
}

interface LinkRow {
  id: string;
  userId: string;
  email: string;
  expiresAt: Date;
  usedAt: Date | null;
  requestedAt: Date;
}

export type LinkState = { usable: true; email: string } | { usable: false; why: string };

const UNKNOWN =
  'This link is not one Gatewell sent, or it was cut short when it was copied. Ask for a new one.';

/** Why a link does not work, or null when it does (the account active and its password unchanged since the request). */
function linkProblem(link: LinkRow | undefined, user: User | null, now: Date): string | null {
  if (!link || !user) return UNKNOWN;
  if (link.usedAt) return 'This link has been used already. Ask for a new one if you need it.';
  if (link.expiresAt <= now)
    return 'This link has run out (a link works for a set time, and a newer link replaces older ones). Ask for a new one.';
  if (user.disabledAt) return 'This account is disabled; an administrator can enable it again.';
  if (user.passwordChangedAt && user.passwordChangedAt > link.requestedAt)
    return 'The password of this account has changed since this link was sent. Ask for a new one if you need it.';
  return null;
}

async function findLink(
  token: string,
  transaction?: Transaction,
  lock = false,
): Promise<LinkRow | undefined> {
  db();
  const row = await PasswordLink.findOne({
    attributes: ['id', 'userId', 'email', 'expiresAt', 'usedAt', 'requestedAt'],
    where: { tokenSha256: sha256(token) },
    raw: true,
    ...(transaction ? { transaction, ...(lock ? { lock: transaction.LOCK.UPDATE } : {}) } : {}),
  });
  return (row as LinkRow | null) ?? undefined;
}

/** Whether a link opened from a mail still works, for the page that asks for the new password. */
export async function passwordLinkState(token: string): Promise<LinkState> {
  if (!/^[A-Za-z0-9_-]{43}$/.test(token)) return { usable: false, why: UNKNOWN };
  const link = await findLink(token);
  const user = link ? await User.findByPk(link.userId) : null;
  const problem = linkProblem(link, user, new Date());
  return problem ? { usable: false, why: problem } : { usable: true, email: link!.email };
}

/**
 * Sets the new password through a link: once, within its time, for an active account whose password has
 * not changed since. Every session of the account ends (its session version moves on), the link is spent,
 * and the change is audited; the person then signs in with the new password.
 */
export async function setPasswordByLink(
  raw: SetPasswordByLinkInput,
  address: string,
): Promise<{ email: string }> {
  const input = parseOrRefuse(setPasswordByLinkSchema, raw);
  const passwordHash = await hashPassword(input.newPassword);
  return db().transaction(async (transaction) => {
    const link = await findLink(input.token, transaction, true);
    const user = link
      ? await User.findByPk(link.userId, { transaction, lock: transaction.LOCK.UPDATE })
      : null;
    const now = new Date();
    const problem = linkProblem(link, user, now);
    if (problem || !link || !user) throw new AppError('conflict', problem ?? UNKNOWN);
    await PasswordLink.update({ usedAt: now }, { where: { id: link.id }, transaction });
    const before = {
      passwordChangedAt: user.passwordChangedAt?.toISOString() ?? null,
      sessionVersion: user.sessionVersion,
    };
    await user.update(
      {
        passwordHash,
        passwordChangedAt: now,
        passwordChangeRequired: false,
        sessionVersion: user.sessionVersion + 1,
      },
      { transaction },
    );
    await recordAudit(
      {
        actorId: user.id,
        action: 'set_password_by_link',
        entityType: 'user',
        entityId: user.id,
        before,
        after: { passwordChangedAt: now.toISOString(), sessionVersion: user.sessionVersion, linkId: link.id },
        address,
      },
      transaction,
    );
    return { email: user.email };
  });
}
