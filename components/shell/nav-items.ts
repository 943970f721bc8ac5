import type { Role } from '@/models/user-role';

export interface NavItem {
  href: string;
  label: string;
  /** Roles that see the entry; empty means every signed-in user. */
  roles: Role[];
}

/** Gatewell's main navigation, in the order of the daily flow. */
export const NAV_ITEMS: NavItem[] = [
  { href: '/', label: 'My work', roles: [] },
  { href: '/plates', label: 'Plates', roles: [] },
  { href: '/plates/import', label: 'Import a plate', roles: ['biologist'] },
  { href: '/compounds', label: 'Compounds', roles: [] },
  { href: '/screens', label: 'Screens', roles: [] },
  { href: '/audit', label: 'Audit trail', roles: ['admin', 'approver'] },
  { href: '/admin/users', label: 'Users', roles: ['admin'] },
  { href: '/admin/outbox', label: 'Mail outbox', roles: ['admin'] },
  { href: '/account', label: 'Account', roles: [] },
];

export function navItemsFor(roles: Role[]): NavItem[] {
  return NAV_ITEMS.filter((item) => item.roles.length === 0 || item.roles.some((role) => roles.includes(role)));
}
