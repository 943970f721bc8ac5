'use client';

import { AppLink } from '@/components/ui/app-link';
import { usePathname } from 'next/navigation';
import type { NavItem } from './nav-items';

function matches(pathname: string, href: string): boolean {
  return href === '/' ? pathname === '/' : pathname === href || pathname.startsWith(`${href}/`);
}

/** The entry for this page: the longest href that matches, so /plates/import is not also "Plates". */
function activeHref(pathname: string, items: NavItem[]): string | undefined {
  return items.filter((item) => matches(pathname, item.href)).sort((a, b) => b.href.length - a.href.length)[0]
    ?.href;
}

export function NavLinks({ items }: { items: NavItem[] }) {
  const pathname = usePathname();
  const current = activeHref(pathname, items);
  return (
    <ul className="flex gap-1 overflow-x-auto lg:flex-col">
      {items.map((item) => {
        const active = item.href === current;
        return (
          <li key={item.href}>
            <AppLink
              href={item.href}
              aria-current={active ? 'page' : undefined}
              className={`block whitespace-nowrap rounded-md px-3 py-2 text-sm font-medium ${
                active ? 'bg-lagoon-700 text-white' : 'text-ink-100 hover:bg-ink-800 hover:text-white'
              }`}
            >
              {item.label}
            </AppLink>
          </li>
        );
      })}
    </ul>
  );
}
