import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { generatePassword, hashPassword } from '@/lib/auth/passwords';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseOrRefuse } from '@/lib/validation/parse';
import { resetPasswordSchema, type ResetPasswordInput } from '@/lib/validation/users';
import { lockUser, snapshotOf, summaryOf, type UserSummary } from './records';

export interface PasswordReset {
  user: UserSummary;
  /** The generated password, to be shown to the admin once; null when the admin set it. */
  temporaryPassword: string | null;
}

/**
 * Sets a new password for someone who lost theirs and ends all their sessions; they must choose their
 * own at their next sign-in. Admins only, and not for their own account (that goes through the password change, which asks for the current one).
 */
export async function resetPassword(actor: Actor, raw: ResetPasswordInput): Promise<PasswordReset> {
  requireCapability(actor, 'manageUsers');
  const input = parseOrRefuse(resetPasswordSchema, raw);
  if (input.userId === actor.id) {
    throw new AppError(
      'conflict',
      'Change your own password on the Account page; it asks for your current one.',
    );
  }
  const password = input.password ?? generatePassword();
  const passwordHash = await hashPassword(password);
  return db().transaction(async (transaction) => {
    const { user, roles } = await lockUser(input.userId, transaction);
    const before = snapshotOf(user, roles);
    await user.update(
      {
        passwordHash,
        passwordChangedAt: new Date(),
        passwordChangeRequired: true,
        sessionVersion: user.sessionVersion + 1,
      },
      { transaction },
    );
    await recordAudit(
      {
        actorId: actor.id,
        action: 'reset_password',
        entityType: 'user',
        entityId: user.id,
        before,
        after: { ...snapshotOf(user, roles), newPassword: input.password ? 'set by admin' : 'generated' },
        reason: input.reason,
        address: actor.address,
      },
      transaction,
    );
    return { user: summaryOf(user, roles), temporaryPassword: input.password ? null : password };
  });
}
