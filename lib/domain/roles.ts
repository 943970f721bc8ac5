// Gatewell's roles, their names for people, and the work each may do (DESIGN.md, people and roles).
// Pure: services, pages, navigation and forms all read who may do what from here.
import { z } from 'zod';

export const ROLES = ['chemist', 'biologist', 'approver', 'admin'] as const;
export const roleSchema = z.enum(ROLES, 'Choose roles from the list.');
export type Role = z.infer<typeof roleSchema>;

/** A role as people read it. */
export const ROLE_LABEL: Record<Role, string> = {
  chemist: 'Chemist',
  biologist: 'Biologist',
  approver: 'Approver',
  admin: 'Admin',
};

/** The work a role allows, as the user forms describe it. */
export const ROLE_DUTY: Record<Role, string> = {
  chemist: 'registers compounds and verifies plate compound maps',
  biologist: 'imports plates, reviews QC and fits, submits plates',
  approver: 'approves or returns submitted plates with a signature; reads the audit trail',
  admin: 'manages users, screens and thresholds; reads the audit trail',
};

/**
 * Who may do what: each piece of work and the roles that allow it (any one of them). Services check it
 * with `requireCapability`, pages through `PAGE_CAPABILITIES` (lib/auth/page-roles.ts), route handlers and actions through their roles, and the
 * navigation shows an entry to the same roles. Reading results needs no role.
 */
export const CAPABILITIES = {
  /** Create accounts, change roles, disable, reset passwords. */
  manageUsers: ['admin'],
  /** The mail outbox: see it, send waiting mail, send a failed message again. */
  manageMail: ['admin'],
  /** Create and change screens, their QC thresholds, exposures and targets. */
  manageScreens: ['admin'],
  /** Read and export the audit trail. */
  readAudit: ['admin', 'approver'],
  /** Register compounds and batches, one by one or from a sheet. */
  registerCompounds: ['chemist', 'admin'],
  /** Import a plate export. */
  importPlates: ['biologist'],
  /** Exclude wells and choose the fit model of a plate. */
  reviewPlates: ['biologist'],
  /** Sign-off: verify a plate's compound map. */
  verifyCompoundMap: ['chemist'],
  /** Sign-off: submit a reviewed plate for approval, or reopen a returned one for rework. */
  submitPlates: ['biologist'],
  /** Sign-off: approve a submitted plate or return it for rework. */
  decidePlates: ['approver'],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

/** The roles that allow a piece of work (any one of them). */
export function rolesFor(capability: Capability): readonly Role[] {
  return CAPABILITIES[capability];
}

/** Whether someone holding these roles may do the work. */
export function rolesAllow(roles: readonly Role[], capability: Capability): boolean {
  return CAPABILITIES[capability].some((role) => roles.includes(role));
}
