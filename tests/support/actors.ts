import { hashPassword } from '@/lib/auth/passwords';
import type { Actor } from '@/lib/auth/roles';
import type { Role } from '@/lib/domain/roles';
import { db } from '@/lib/db';
import { User, UserRole } from '@/models';

const DEFAULT_PASSWORD = 'test-password-123';
/**
 * One real argon2 hash of the default password per test process, shared by the users made with it: each
 * hash costs about a quarter of a second of CPU, and the suite makes well over a thousand users. Users
 * given a password of their own get a hash of their own.
 */
let defaultHash: Promise<string> | undefined;
const hashFor = (password: string) =>
  password === DEFAULT_PASSWORD ? (defaultHash ??= hashPassword(password)) : hashPassword(password);

/** Creates a real user with the given roles in the test database and returns it as an Actor. */
export async function makeActor(
  roles: Role[],
  email = `${roles.join('-') || 'nobody'}-${Math.random().toString(36).slice(2, 8)}@example.org`,
  password = DEFAULT_PASSWORD,
): Promise<Actor> {
  db();
  const user = await User.create({
    email,
    name: `Test ${roles.join('/')}`,
    passwordHash: await hashFor(password),
    disabledAt: null,
    lastSignInAt: null,
  });
  for (const role of roles) await UserRole.create({ userId: user.id, role });
  return { id: user.id, email, name: user.name, roles, address: '127.0.0.1' };
}
