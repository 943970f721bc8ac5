import 'server-only';
import { db } from '@/lib/db';
import { User, UserRole } from '@/models';
import type { Actor, Role } from './roles';

/** Loads an enabled user with roles, or null; shared by the session check, sign-in and scripts. */
export async function loadActor(userId: string, address: string): Promise<(Actor & { sessionVersion: number }) | null> {
  db();
  const user = await User.findByPk(userId, { include: [{ model: UserRole, as: 'roles' }] });
  if (!user || user.disabledAt) return null;
  const roles = ((user.get('roles') as UserRole[] | undefined) ?? []).map((r) => r.role as Role).sort();
  return { id: user.id, email: user.email, name: user.name, roles, address, sessionVersion: user.sessionVersion, passwordChangeRequired: user.passwordChangeRequired };
}
