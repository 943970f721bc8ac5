import type { Metadata } from 'next';
import { MarkAllSeenButton, NoticeList } from '@/components/notices/notice-list';
import { AppLink } from '@/components/ui/app-link';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Pager } from '@/components/ui/pager';
import { requireActor } from '@/lib/auth/current-actor';
import { NOTICES_PER_PAGE } from '@/lib/domain/notices';
import { listNotices } from '@/lib/notices/service';
import { noticePageSchema } from '@/lib/validation/notices';
import { markAllNoticesSeenAction, markNoticeSeenAction, openNoticeAction } from './actions';

export const metadata: Metadata = { title: 'Notices' };

const pageHref = (page: number) => (page > 1 ? `/notices?page=${page}` : '/notices');

/** The signed-in person's notices about plates and imports, newest first, paged. */
export default async function NoticesPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const actor = await requireActor();
  const result = await listNotices(actor, noticePageSchema.parse((await searchParams).page));
  const first = (result.page - 1) * NOTICES_PER_PAGE + 1;
  const last = first + result.items.length - 1;
  return (
    <>
      <PageHeader
        title="Notices"
        intro={
          <>
            What Gatewell told you about plates and imports, newest first; times in {result.timeZone}. Opening
            a notice marks it seen. Whether notices come by e-mail too is your choice on the{' '}
            <AppLink href="/account#notices-heading" className="underline">
              Account
            </AppLink>{' '}
            page.
          </>
        }
        actions={
          result.unseen && result.newestAt ? (
            <MarkAllSeenButton action={markAllNoticesSeenAction} upTo={result.newestAt} />
          ) : null
        }
      />
      {result.total ? (
        <>
          <Pager
            label="Pages of notices"
            page={result.page}
            hasOlder={result.page < result.pages}
            pageHref={pageHref}
            className="mb-3"
          >
            Notices {first}–{last} of {result.total}, {result.unseen} new
            {result.pages > 1 ? ` (page ${result.page} of ${result.pages})` : ''}
          </Pager>
          <NoticeList
            items={result.items}
            timeZone={result.timeZone}
            openAction={openNoticeAction}
            markSeenAction={markNoticeSeenAction}
          />
        </>
      ) : (
        <EmptyState title="No notices yet">
          When a plate you may sign next moves on, or an import waits for compounds you may register, it shows
          here.
        </EmptyState>
      )}
    </>
  );
}
