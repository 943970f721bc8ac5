import type { Role } from '@/models/user-role';

/** The roles as forms offer them, each with the work it allows (DESIGN.md, people and roles). */
export const ROLE_CHOICES: { role: Role; label: string; duty: string }[] = [
  { role: 'chemist', label: 'Chemist', duty: 'registers compounds and verifies plate compound maps' },
  { role: 'biologist', label: 'Biologist', duty: 'imports plates, reviews QC and fits, submits plates' },
  { role: 'approver', label: 'Approver', duty: 'approves or returns submitted plates with a signature; reads the audit trail' },
  { role: 'admin', label: 'Admin', duty: 'manages users, screens and thresholds; reads the audit trail' },
];
