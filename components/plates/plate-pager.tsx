import { Pager } from '@/components/ui/pager';
import type { PlatePage } from '@/lib/plates/list';

/** Which plates this page shows, with links to the newer and older pages (pageHref gives a page's address). */
export function PlatePager({ result, pageHref }: { result: PlatePage; pageHref: (page: number) => string }) {
  const first = (result.page - 1) * result.pageSize + 1;
  const last = first + result.plates.length - 1;
  return (
    <Pager label="Pages of plates" page={result.page} hasOlder={last < result.total} pageHref={pageHref}>
      Plates {first}–{last} of {result.total}, newest first
    </Pager>
  );
}
