import { AppLink } from '@/components/ui/app-link';
import type { PlatePage } from '@/lib/plates/list';

/** Which plates this page shows, with links to the newer and older pages (pageHref gives a page's address). */
export function PlatePager({ result, pageHref }: { result: PlatePage; pageHref: (page: number) => string }) {
  const first = (result.page - 1) * result.pageSize + 1;
  const last = first + result.plates.length - 1;
  return (
    <div className="mb-2 flex items-center justify-between text-sm text-ink-700">
      <p aria-live="polite">
        Plates {first}–{last} of {result.total}, newest first
      </p>
      <nav aria-label="Pages of plates" className="flex gap-2">
        {result.page > 1 ? (
          <AppLink href={pageHref(result.page - 1)} className="gw-button-quiet py-1">
            Newer
          </AppLink>
        ) : null}
        {last < result.total ? (
          <AppLink href={pageHref(result.page + 1)} className="gw-button-quiet py-1">
            Older
          </AppLink>
        ) : null}
      </nav>
    </div>
  );
}
