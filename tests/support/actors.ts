import { hashPassword } from '@/lib/auth/passwords';
import type { Actor } from '@/lib/auth/roles';
import type { Role } from '@/lib/domain/roles';
import { db } from '@/lib/db';
import { User, UserRole } from '@/models';

/** Creates a real user with the given roles in the test database and returns it as an Actor. */
export async function makeActor(
  roles: Role[],
  email = `${roles.join('-') || 'nobody'}-${Math.random().toString(36).slice(2, 8)}@example.org`,
  password = 'test-password-123',
): Promise<Actor> {
  db();
  const user = await User.create({
    email,
    name: `Test ${roles.join('/')}`,
    passwordHash: await hashPassword(password),
    disabledAt: null,
    lastSignInAt: null,
  });
  for (const role of roles) await UserRole.create({ userId: user.id, role });
  return { id: user.id, email, name: user.name, roles, address: '127.0.0.1' };
}
