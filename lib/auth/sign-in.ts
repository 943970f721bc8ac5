import 'server-only';
import { Op } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { db } from '@/lib/db';
import { LoginAttempt, User } from '@/models';
import { verifyPassword } from './passwords';

/** Failed sign-ins allowed per account within the window (common practice, no source). */
export const MAX_FAILURES_PER_ACCOUNT = 5;
/** Failed sign-ins allowed per client address within the window (common practice, no source). */
export const MAX_FAILURES_PER_ADDRESS = 20;
export const THROTTLE_WINDOW_MS = 15 * 60 * 1000;

export type SignInResult =
  | { ok: true; userId: string; sessionVersion: number; passwordChangeRequired: boolean }
  | { ok: false; reason: 'invalid' | 'throttled' };

/** True when the account or the address has used up its failed attempts within the window. */
export async function isThrottled(email: string, address: string): Promise<boolean> {
  const since = new Date(Date.now() - THROTTLE_WINDOW_MS);
  const failed = { succeeded: false, attemptedAt: { [Op.gte]: since } };
  const [byAccount, byAddress] = await Promise.all([
    LoginAttempt.count({ where: { ...failed, email } }),
    LoginAttempt.count({ where: { ...failed, address } }),
  ]);
  return byAccount >= MAX_FAILURES_PER_ACCOUNT || byAddress >= MAX_FAILURES_PER_ADDRESS;
}

/**
 * Checks an e-mail and password. Unknown accounts, disabled accounts and wrong passwords give the
 * same answer after the same work; every attempt is stored for throttling and audited.
 */
export async function signIn(rawEmail: string, password: string, address: string): Promise<SignInResult> {
  const sequelize = db();
  const email = rawEmail.trim().toLowerCase();
  if (await isThrottled(email, address)) {
    await sequelize.transaction(async (transaction) => {
      await recordAudit(
        { actorId: null, action: 'sign_in_throttled', entityType: 'session', after: { email }, address },
        transaction,
      );
    });
    return { ok: false, reason: 'throttled' };
  }

  const user = await User.findOne({ where: { email } });
  const passwordOk = await verifyPassword(user?.passwordHash ?? null, password);
  const ok = Boolean(user && passwordOk && !user.disabledAt);

  await sequelize.transaction(async (transaction) => {
    await LoginAttempt.create({ email, address, succeeded: ok }, { transaction });
    if (ok && user) {
      await user.update({ lastSignInAt: new Date() }, { transaction });
    }
    await recordAudit(
      {
        actorId: ok && user ? user.id : null,
        action: ok ? 'sign_in' : 'sign_in_failed',
        entityType: 'session',
        entityId: ok && user ? user.id : null,
        after: { email },
        address,
      },
      transaction,
    );
  });

  return ok && user
    ? {
        ok: true,
        userId: user.id,
        sessionVersion: user.sessionVersion,
        passwordChangeRequired: user.passwordChangeRequired,
      }
    : { ok: false, reason: 'invalid' };
}
