import { rolesFor, type Capability, type Role } from '@/lib/domain/roles';

// No 'server-only' here: the proxy sets the header named below, and the signed-in layout reads it.

/** Request header carrying the page's path from the proxy to the signed-in layout. */
export const PATHNAME_HEADER = 'x-gatewell-pathname';

/**
 * Pages that need a role, by path prefix and the work they are for (lib/domain/roles.ts); the first
 * matching prefix wins. Every other signed-in page is open to every signed-in role.
 */
export const PAGE_CAPABILITIES: { prefix: string; capability: Capability }[] = [
  { prefix: '/admin/outbox', capability: 'manageMail' },
  { prefix: '/admin', capability: 'manageUsers' },
  { prefix: '/audit', capability: 'readAudit' },
  { prefix: '/plates/import', capability: 'importPlates' },
  { prefix: '/screens/new', capability: 'manageScreens' },
];

/** The roles a page needs (any one of them), or null when every signed-in person may open it. */
export function rolesForPath(pathname: string): readonly Role[] | null {
  const rule = PAGE_CAPABILITIES.find(
    ({ prefix }) => pathname === prefix || pathname.startsWith(`${prefix}/`),
  );
  return rule ? rolesFor(rule.capability) : null;
}
