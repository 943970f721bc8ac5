import type { ReactNode } from 'react';
import { AppLink } from '@/components/ui/app-link';

/**
 * A list's place among its pages: what this page shows (children, read out when it changes) and links to
 * the newer and older pages where there are any. Pages are numbered from 1, newest first.
 */
export function Pager({
  label,
  page,
  hasOlder,
  pageHref,
  children,
  between,
  className = 'mb-2',
}: {
  /** The navigation's accessible name, e.g. "Pages of plates". */
  label: string;
  page: number;
  hasOlder: boolean;
  pageHref: (page: number) => string;
  children: ReactNode;
  /** Shown between the summary and the links (the audit trail's downloads). */
  between?: ReactNode;
  className?: string;
}) {
  return (
    <div className={`${className} flex flex-wrap items-center justify-between gap-2 text-sm text-ink-700`}>
      <p aria-live="polite">{children}</p>
      {between}
      <nav aria-label={label} className="flex gap-2">
        {page > 1 ? (
          <AppLink href={pageHref(page - 1)} className="gw-button-quiet py-1">
            Newer
          </AppLink>
        ) : null}
        {hasOlder ? (
          <AppLink href={pageHref(page + 1)} className="gw-button-quiet py-1">
            Older
          </AppLink>
        ) : null}
      </nav>
    </div>
  );
}
