import 'server-only';
import { UniqueConstraintError } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { generatePassword, hashPassword } from '@/lib/auth/passwords';
import { requireRole, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseOrRefuse } from '@/lib/validation/parse';
import { createUserSchema, type CreateUserInput } from '@/lib/validation/users';
import { User, UserRole } from '@/models';
import { snapshotOf, summaryOf, type UserSummary } from './records';

export interface CreatedUser {
  user: UserSummary;
  /** The generated initial password, to be shown to the admin once; null when the admin set it. */
  initialPassword: string | null;
}

const emailTaken = () =>
  new AppError('conflict', 'An account with this e-mail address exists already.', {
    fieldErrors: { email: ['An account with this e-mail address exists already.'] },
  });

/** Creates an account with its roles and an initial password (set by the admin, or generated). Admins only. */
export async function createUser(actor: Actor, raw: CreateUserInput): Promise<CreatedUser> {
  requireRole(actor, 'admin');
  const input = parseOrRefuse(createUserSchema, raw);
  const password = input.password ?? generatePassword();
  const passwordHash = await hashPassword(password);
  try {
    return await db().transaction(async (transaction) => {
      if (await User.findOne({ where: { email: input.email }, transaction })) throw emailTaken();
      const user = await User.create(
        { email: input.email, name: input.name, passwordHash, passwordChangeRequired: true, disabledAt: null, lastSignInAt: null },
        { transaction },
      );
      await UserRole.bulkCreate(input.roles.map((role) => ({ userId: user.id, role })), { transaction });
      await recordAudit(
        {
          actorId: actor.id,
          action: 'create',
          entityType: 'user',
          entityId: user.id,
          after: { ...snapshotOf(user, input.roles), initialPassword: input.password ? 'set by admin' : 'generated' },
          address: actor.address,
        },
        transaction,
      );
      return { user: summaryOf(user, input.roles), initialPassword: input.password ? null : password };
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw emailTaken();
    throw error;
  }
}
