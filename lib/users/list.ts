import 'server-only';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import type { Role } from '@/lib/domain/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseId } from '@/lib/validation/ids';
import { User, UserRole } from '@/models';
import { summaryOf, type UserSummary } from './records';

function rolesOf(user: User): Role[] {
  return ((user.get('roles') as UserRole[] | undefined) ?? []).map((row) => row.role);
}

/** Every user, enabled ones first, then by name. Admins only. */
export async function listUsers(actor: Actor): Promise<UserSummary[]> {
  requireCapability(actor, 'manageUsers');
  db();
  const users = await User.findAll({ include: [{ model: UserRole, as: 'roles' }], order: [['name', 'ASC']] });
  return users
    .map((user) => summaryOf(user, rolesOf(user)))
    .sort((a, b) => Number(a.disabledAt !== null) - Number(b.disabledAt !== null));
}

/** One user by id. Admins only; an unknown id is not found. */
export async function getUser(actor: Actor, rawUserId: string): Promise<UserSummary> {
  requireCapability(actor, 'manageUsers');
  db();
  const user = await User.findByPk(parseId(rawUserId, 'user'), {
    include: [{ model: UserRole, as: 'roles' }],
  });
  if (!user) throw new AppError('not_found', 'No such user.');
  return summaryOf(user, rolesOf(user));
}
