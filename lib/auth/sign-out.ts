import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { db } from '@/lib/db';
import { User } from '@/models';
import type { Actor } from './roles';

/**
 * Records a sign-out and moves the person's session version on, so that every copy of their session
 * cookie (an earlier copy, another browser's) stops working.
 */
export async function recordSignOut(actor: Actor): Promise<void> {
  await db().transaction(async (transaction) => {
    await User.increment('sessionVersion', { where: { id: actor.id }, transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'sign_out',
        entityType: 'session',
        entityId: actor.id,
        address: actor.address,
      },
      transaction,
    );
  });
}
