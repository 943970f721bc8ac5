import 'server-only';
import { randomBytes } from 'node:crypto';
import { UniqueConstraintError } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { issuePasswordLink } from '@/lib/auth/password-link';
import { generatePassword, hashPassword } from '@/lib/auth/passwords';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseOrRefuse } from '@/lib/validation/parse';
import { createUserSchema, type CreateUserInput } from '@/lib/validation/users';
import { User, UserRole } from '@/models';
import { snapshotOf, summaryOf, type UserSummary } from './records';

export interface CreatedUser {
  user: UserSummary;
  /** The generated initial password, to be shown to the admin once; null when the admin set it or a link was mailed. */
  initialPassword: string | null;
  /** True when the person got a link by e-mail to choose their own password. */
  invited: boolean;
}

const emailTaken = () =>
  new AppError('conflict', 'An account with this e-mail address exists already.', {
    fieldErrors: { email: ['An account with this e-mail address exists already.'] },
  });

/**
 * Creates an account with its roles. The person gets in with a link by e-mail to choose their own password
 * (the account's password is then a random one nobody sees; the mail is queued in the same transaction),
 * or with an initial password the admin set or Gatewell generated, good for one sign-in. Admins only.
 */
export async function createUser(actor: Actor, raw: CreateUserInput): Promise<CreatedUser> {
  requireCapability(actor, 'manageUsers');
  const input = parseOrRefuse(createUserSchema, raw);
  const invited = input.access === 'link';
  const password = invited ? randomBytes(32).toString('base64url') : (input.password ?? generatePassword());
  const passwordHash = await hashPassword(password);
  try {
    return await db().transaction(async (transaction) => {
      if (await User.findOne({ where: { email: input.email }, transaction })) throw emailTaken();
      const user = await User.create(
        {
          email: input.email,
          name: input.name,
          passwordHash,
          passwordChangeRequired: !invited,
          disabledAt: null,
          lastSignInAt: null,
        },
        { transaction },
      );
      await UserRole.bulkCreate(
        input.roles.map((role) => ({ userId: user.id, role })),
        { transaction },
      );
      if (invited)
        await issuePasswordLink(
          user,
          { purpose: 'invitation', address: actor.address, invitedBy: actor, roles: input.roles },
          transaction,
        );
      await recordAudit(
        {
          actorId: actor.id,
          action: 'create',
          entityType: 'user',
          entityId: user.id,
          after: {
            ...snapshotOf(user, input.roles),
            initialPassword: invited ? 'link by e-mail' : input.password ? 'set by admin' : 'generated',
          },
          address: actor.address,
        },
        transaction,
      );
      return {
        user: summaryOf(user, input.roles),
        initialPassword: invited || input.password ? null : password,
        invited,
      };
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw emailTaken();
    throw error;
  }
}
