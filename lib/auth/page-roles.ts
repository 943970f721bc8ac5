import type { Role } from '@/models/user-role';

// No 'server-only' here: the proxy sets the header named below, and the signed-in layout reads it.

/** Request header carrying the page's path from the proxy to the signed-in layout. */
export const PATHNAME_HEADER = 'x-gatewell-pathname';

/** Pages that need a role, by path prefix; every other signed-in page is open to every signed-in role. */
export const PAGE_ROLES: { prefix: string; roles: Role[] }[] = [
  { prefix: '/admin', roles: ['admin'] },
  { prefix: '/audit', roles: ['admin', 'approver'] },
  { prefix: '/plates/import', roles: ['biologist'] },
  { prefix: '/screens/new', roles: ['admin'] },
];

/** The roles a page needs (any one of them), or null when every signed-in person may open it. */
export function rolesForPath(pathname: string): Role[] | null {
  const rule = PAGE_ROLES.find(({ prefix }) => pathname === prefix || pathname.startsWith(`${prefix}/`));
  return rule ? rule.roles : null;
}
