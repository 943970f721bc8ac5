import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseOrRefuse } from '@/lib/validation/parse';
import { userStatusSchema, type UserStatusInput } from '@/lib/validation/users';
import {
  assertAnotherEnabledAdmin,
  lockAdminSet,
  lockUser,
  snapshotOf,
  summaryOf,
  type UserSummary,
} from './records';

/**
 * Disables an account: it can no longer sign in, and its open sessions end (session_version moves on,
 * so re-enabling later does not revive them). Refuses the last enabled admin and the acting admin.
 */
export async function disableUser(actor: Actor, raw: UserStatusInput): Promise<UserSummary> {
  requireCapability(actor, 'manageUsers');
  const input = parseOrRefuse(userStatusSchema, raw);
  if (input.userId === actor.id) {
    throw new AppError('conflict', 'You cannot disable your own account. Ask another admin to do it.');
  }
  return db().transaction(async (transaction) => {
    await lockAdminSet(transaction);
    const { user, roles } = await lockUser(input.userId, transaction);
    if (user.disabledAt) throw new AppError('conflict', 'This account is disabled already.');
    if (roles.includes('admin'))
      await assertAnotherEnabledAdmin(user.id, 'disable this account', transaction);
    const before = snapshotOf(user, roles);
    await user.update({ disabledAt: new Date(), sessionVersion: user.sessionVersion + 1 }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'disable',
        entityType: 'user',
        entityId: user.id,
        before,
        after: snapshotOf(user, roles),
        reason: input.reason,
        address: actor.address,
      },
      transaction,
    );
    return summaryOf(user, roles);
  });
}

/** Enables a disabled account again; the person signs in afresh. Admins only. */
export async function enableUser(actor: Actor, raw: UserStatusInput): Promise<UserSummary> {
  requireCapability(actor, 'manageUsers');
  const input = parseOrRefuse(userStatusSchema, raw);
  return db().transaction(async (transaction) => {
    await lockAdminSet(transaction);
    const { user, roles } = await lockUser(input.userId, transaction);
    if (!user.disabledAt) throw new AppError('conflict', 'This account is enabled already.');
    const before = snapshotOf(user, roles);
    await user.update({ disabledAt: null }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'enable',
        entityType: 'user',
        entityId: user.id,
        before,
        after: snapshotOf(user, roles),
        reason: input.reason,
        address: actor.address,
      },
      transaction,
    );
    return summaryOf(user, roles);
  });
}
