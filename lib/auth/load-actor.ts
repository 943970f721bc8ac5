import 'server-only';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import type { Role } from '@/lib/domain/roles';
import type { Actor } from './roles';

interface ActorRow {
  id: string;
  email: string;
  name: string;
  sessionVersion: number;
  passwordChangeRequired: boolean;
  roles: Role[];
}

/**
 * Loads an enabled user with roles, or null; shared by the session check, sign-in and scripts. Every
 * signed-in request asks this, so it is one plain query (roles sorted by PostgreSQL) with no model instances.
 */
export async function loadActor(userId: string, address: string): Promise<(Actor & { sessionVersion: number }) | null> {
  const [user] = await db().query<ActorRow>(
    `select u.id, u.email, u.name, u.session_version as "sessionVersion", u.password_change_required as "passwordChangeRequired",
            coalesce(array_agg(r.role::text order by r.role::text) filter (where r.role is not null), '{}') as roles
       from users u left join user_roles r on r.user_id = u.id
      where u.id = :userId and u.disabled_at is null
      group by u.id`,
    { type: QueryTypes.SELECT, replacements: { userId } },
  );
  if (!user) return null;
  return { id: user.id, email: user.email, name: user.name, roles: user.roles, address, sessionVersion: user.sessionVersion, passwordChangeRequired: user.passwordChangeRequired };
}
