import { rolesAllow, type Capability, type Role } from '@/lib/domain/roles';

export interface NavItem {
  href: string;
  label: string;
  /** The work the page is for (lib/domain/roles.ts); null means every signed-in user sees the entry. */
  capability: Capability | null;
}

/** Gatewell's main navigation, in the order of the daily flow. */
export const NAV_ITEMS: NavItem[] = [
  { href: '/', label: 'My work', capability: null },
  { href: '/plates', label: 'Plates', capability: null },
  { href: '/plates/import', label: 'Import a plate', capability: 'importPlates' },
  { href: '/compounds', label: 'Compounds', capability: null },
  { href: '/screens', label: 'Screens', capability: null },
  { href: '/audit', label: 'Audit trail', capability: 'readAudit' },
  { href: '/admin/users', label: 'Users', capability: 'manageUsers' },
  { href: '/admin/outbox', label: 'Mail outbox', capability: 'manageMail' },
  { href: '/account', label: 'Account', capability: null },
];

export function navItemsFor(roles: Role[]): NavItem[] {
  return NAV_ITEMS.filter((item) => item.capability === null || rolesAllow(roles, item.capability));
}
