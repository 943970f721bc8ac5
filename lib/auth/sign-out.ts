import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import { db } from '@/lib/db';
import { User } from '@/models';
import type { Actor } from './roles';

/**
 * Moves the person's session_version on and records the sign-out: the current cookie, any copy of it
 * and the person's sessions in other browsers all stop working.
 */
export async function endAllSessions(actor: Actor): Promise<void> {
  await db().transaction(async (transaction) => {
    await User.increment('sessionVersion', { where: { id: actor.id }, transaction });
    await recordAudit(
      { actorId: actor.id, action: 'sign_out', entityType: 'session', entityId: actor.id, address: actor.address },
      transaction,
    );
  });
}
