import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseOrRefuse } from '@/lib/validation/parse';
import { changeRolesSchema, type ChangeRolesInput } from '@/lib/validation/users';
import { UserRole } from '@/models';
import {
  assertAnotherEnabledAdmin,
  lockAdminSet,
  lockUser,
  snapshotOf,
  summaryOf,
  type UserSummary,
} from './records';

/**
 * Replaces a user's roles. Refuses to take the admin role from the last enabled admin. Roles are read on
 * every request, so the change applies to the user's open sessions at once. Admins only.
 */
export async function changeRoles(actor: Actor, raw: ChangeRolesInput): Promise<UserSummary> {
  requireCapability(actor, 'manageUsers');
  const input = parseOrRefuse(changeRolesSchema, raw);
  return db().transaction(async (transaction) => {
    await lockAdminSet(transaction);
    const { user, roles: before } = await lockUser(input.userId, transaction);
    const after = input.roles;
    const added = after.filter((role) => !before.includes(role));
    const removed = before.filter((role) => !after.includes(role));
    if (!added.length && !removed.length) {
      throw new AppError('invalid', 'These are the roles the user holds already; nothing was changed.', {
        fieldErrors: { roles: ['Tick or untick at least one role.'] },
      });
    }
    if (removed.includes('admin') && user.disabledAt === null) {
      await assertAnotherEnabledAdmin(user.id, 'take away its admin role', transaction);
    }
    if (removed.length) await UserRole.destroy({ where: { userId: user.id, role: removed }, transaction });
    if (added.length)
      await UserRole.bulkCreate(
        added.map((role) => ({ userId: user.id, role })),
        { transaction },
      );
    await recordAudit(
      {
        actorId: actor.id,
        action: 'change_roles',
        entityType: 'user',
        entityId: user.id,
        before: snapshotOf(user, before),
        after: snapshotOf(user, after),
        reason: input.reason,
        address: actor.address,
      },
      transaction,
    );
    return summaryOf(user, after);
  });
}
