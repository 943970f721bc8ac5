import { AppError } from '@/lib/errors';
import { rolesFor, type Capability, type Role } from '@/lib/domain/roles';

/** The signed-in person as every service function receives it. */
export interface Actor {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  address: string;
  /** Set for a signed-in person whose password an administrator chose: they must choose their own first. */
  passwordChangeRequired?: boolean;
}

export function hasRole(actor: Actor, ...roles: Role[]): boolean {
  return roles.some((role) => actor.roles.includes(role));
}

/** Refuses the call unless the actor holds at least one of the roles. */
export function requireRole(actor: Actor, ...roles: Role[]): void {
  if (!hasRole(actor, ...roles)) {
    throw new AppError('forbidden', `This needs the ${roles.join(' or ')} role.`);
  }
}

/** Whether the actor may do the work (lib/domain/roles.ts, CAPABILITIES). */
export function can(actor: Actor, capability: Capability): boolean {
  return hasRole(actor, ...rolesFor(capability));
}

/** Refuses the call unless the actor holds one of the roles the work needs. */
export function requireCapability(actor: Actor, capability: Capability): void {
  requireRole(actor, ...rolesFor(capability));
}
