import { ROLE_DUTY, ROLE_LABEL, ROLES, type Role } from '@/lib/domain/roles';

/** The roles as forms offer them, each with the work it allows (DESIGN.md, people and roles). */
export const ROLE_CHOICES: { role: Role; label: string; duty: string }[] = ROLES.map((role) => ({
  role,
  label: ROLE_LABEL[role],
  duty: ROLE_DUTY[role],
}));
