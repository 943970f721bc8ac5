import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { LoginAttempt, User } from '@/models';
import { verifyPassword } from './passwords';
import type { Actor } from './roles';
import { isThrottled, THROTTLE_WINDOW_MS } from './sign-in';

export interface ReverifyContext {
  /** Audit action written when the password is wrong, e.g. `sign_failed`. */
  failedAction: string;
  entityType: string;
  entityId: string | null;
  /** Form field the message belongs to. */
  field: string;
}

/**
 * Checks the signed-in person's password again before a signature or a password change. A wrong
 * password counts as a failed sign-in attempt for throttling and is audited in a transaction of its own,
 * so that the record survives the caller's rollback.
 */
export async function reverifyPassword(
  actor: Actor,
  password: string,
  context: ReverifyContext,
): Promise<void> {
  const sequelize = db();
  const user = await User.findByPk(actor.id, { attributes: ['id', 'email', 'passwordHash', 'disabledAt'] });
  if (!user || user.disabledAt)
    throw new AppError('unauthorized', 'Your account is no longer active. Sign in again.');

  if (await isThrottled(user.email, actor.address)) {
    const minutes = Math.round(THROTTLE_WINDOW_MS / 60_000);
    const message = `Too many wrong passwords. Wait ${minutes} minutes, then try again.`;
    throw new AppError('rate_limited', message, { fieldErrors: { [context.field]: [message] } });
  }
  if (await verifyPassword(user.passwordHash, password)) return;

  await sequelize.transaction(async (transaction) => {
    await LoginAttempt.create(
      { email: user.email, address: actor.address, succeeded: false },
      { transaction },
    );
    await recordAudit(
      {
        actorId: actor.id,
        action: context.failedAction,
        entityType: context.entityType,
        entityId: context.entityId,
        reason: 'password re-entered wrongly',
        address: actor.address,
      },
      transaction,
    );
  });
  const message = 'That password is not right.';
  throw new AppError('invalid', message, { fieldErrors: { [context.field]: [message] } });
}
