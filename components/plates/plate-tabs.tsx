'use client';

import { AppLink } from '@/components/ui/app-link';
import { usePathname } from 'next/navigation';

/** The plate's views as tabs; links, so each view has its own address. */
export function PlateTabs({ plateId }: { plateId: string }) {
  const pathname = usePathname();
  const base = `/plates/${plateId}`;
  const tabs = [
    { href: base, label: 'Wells and QC' },
    { href: `${base}/fits`, label: 'Fits' },
    { href: `${base}/forecast`, label: 'Forecast' },
    { href: `${base}/history`, label: 'Sign-off and history' },
  ];
  return (
    <nav aria-label="Plate views" className="mb-6 flex gap-1 overflow-x-auto border-b border-ink-100">
      {tabs.map((tab) => {
        const active = pathname === tab.href;
        return (
          <AppLink
            key={tab.href}
            href={tab.href}
            aria-current={active ? 'page' : undefined}
            className={`-mb-px whitespace-nowrap border-b-2 px-4 py-2 text-sm font-medium ${active ? 'border-lagoon-600 text-lagoon-700' : 'border-transparent text-ink-700 hover:text-ink-950'}`}
          >
            {tab.label}
          </AppLink>
        );
      })}
    </nav>
  );
}
