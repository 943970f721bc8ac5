import 'server-only';
import type { Transaction } from 'sequelize';
import type { Role } from '@/lib/domain/roles';
import { AppError } from '@/lib/errors';
import { User, UserRole } from '@/models';
import { countOtherEnabledAdmins, lockAdminSetKey } from './queries';

/** A user as the admin pages show it (never the password hash). */
export interface UserSummary {
  id: string;
  name: string;
  email: string;
  roles: Role[];
  disabledAt: string | null;
  lastSignInAt: string | null;
  passwordChangedAt: string;
  createdAt: string;
}

/** What the audit trail keeps of a user before and after a change: no hash, no secret. */
export interface UserSnapshot {
  email: string;
  name: string;
  roles: Role[];
  enabled: boolean;
  /** Moves on whenever the account's sessions are ended (password change or reset, disabling). */
  sessionVersion: number;
  passwordChangedAt: string;
}

const iso = (value: Date | null): string | null => (value ? new Date(value).toISOString() : null);

export function summaryOf(user: User, roles: Role[]): UserSummary {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    roles: [...roles].sort(),
    disabledAt: iso(user.disabledAt),
    lastSignInAt: iso(user.lastSignInAt),
    passwordChangedAt: iso(user.passwordChangedAt)!,
    createdAt: iso(user.createdAt)!,
  };
}

export function snapshotOf(user: User, roles: Role[]): UserSnapshot {
  return {
    email: user.email,
    name: user.name,
    roles: [...roles].sort(),
    enabled: user.disabledAt === null,
    sessionVersion: user.sessionVersion,
    passwordChangedAt: iso(user.passwordChangedAt)!,
  };
}

/** Loads a user and their roles with the user's row locked until the transaction ends. */
export async function lockUser(
  userId: string,
  transaction: Transaction,
): Promise<{ user: User; roles: Role[] }> {
  const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!user) throw new AppError('not_found', 'This user does not exist.');
  const rows = await UserRole.findAll({ where: { userId }, transaction });
  return { user, roles: rows.map((row) => row.role).sort() };
}

/** Serialises every change that could leave Gatewell without an enabled admin. */
export async function lockAdminSet(transaction: Transaction): Promise<void> {
  await lockAdminSetKey(transaction);
}

/** Refuses a change (removing the admin role, disabling) that would leave no other enabled admin. */
export async function assertAnotherEnabledAdmin(
  userId: string,
  change: string,
  transaction: Transaction,
): Promise<void> {
  const others = await countOtherEnabledAdmins(userId, transaction);
  if (!others) {
    throw new AppError(
      'conflict',
      `This is the last enabled admin, so Gatewell cannot ${change}. Give another person the admin role first.`,
    );
  }
}
