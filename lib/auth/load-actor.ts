import 'server-only';
import { selectEnabledActor } from './queries';
import type { Actor } from './roles';

/**
 * Loads an enabled user with roles, or null; shared by the session check, sign-in and scripts. Every
 * signed-in request asks this, so it is one plain query (roles sorted by PostgreSQL) with no model instances.
 */
export async function loadActor(
  userId: string,
  address: string,
): Promise<(Actor & { sessionVersion: number }) | null> {
  const user = await selectEnabledActor(userId);
  if (!user) return null;
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    roles: user.roles,
    address,
    sessionVersion: user.sessionVersion,
    passwordChangeRequired: user.passwordChangeRequired,
  };
}
