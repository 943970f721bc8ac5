import 'server-only';
import { forbidden } from 'next/navigation';
import { requireActor } from './current-actor';
import type { Role } from '@/lib/domain/roles';
import { hasRole, type Actor } from './roles';

/**
 * For pages that need a role: the actor, a redirect to sign-in when there is none, or the forbidden
 * page. The service functions the page calls check the role again.
 */
export async function requirePageRole(...roles: Role[]): Promise<Actor> {
  const actor = await requireActor();
  if (!hasRole(actor, ...roles)) forbidden();
  return actor;
}
