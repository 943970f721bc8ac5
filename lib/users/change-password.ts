import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { hashPassword } from '@/lib/auth/passwords';
import { reverifyPassword } from '@/lib/auth/reverify';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { parseOrRefuse } from '@/lib/validation/parse';
import { changePasswordSchema, type ChangePasswordInput } from '@/lib/validation/users';
import { lockUser, snapshotOf } from './records';

/**
 * Changes the signed-in person's own password after checking the current one (a wrong one counts as a
 * failed attempt). Every other session of theirs ends; the caller re-seals the current session with
 * the session version returned here.
 */
export async function changeOwnPassword(
  actor: Actor,
  raw: ChangePasswordInput,
): Promise<{ sessionVersion: number }> {
  const input = parseOrRefuse(changePasswordSchema, raw);
  await reverifyPassword(actor, input.currentPassword, {
    failedAction: 'change_password_failed',
    entityType: 'user',
    entityId: actor.id,
    field: 'currentPassword',
  });
  const passwordHash = await hashPassword(input.newPassword);
  return db().transaction(async (transaction) => {
    const { user, roles } = await lockUser(actor.id, transaction);
    const before = snapshotOf(user, roles);
    await user.update(
      {
        passwordHash,
        passwordChangedAt: new Date(),
        passwordChangeRequired: false,
        sessionVersion: user.sessionVersion + 1,
      },
      { transaction },
    );
    await recordAudit(
      {
        actorId: actor.id,
        action: 'change_password',
        entityType: 'user',
        entityId: user.id,
        before,
        after: snapshotOf(user, roles),
        address: actor.address,
      },
      transaction,
    );
    return { sessionVersion: user.sessionVersion };
  });
}
