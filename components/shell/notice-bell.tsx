import { AppLink } from '@/components/ui/app-link';

/** The header's bell: a link to the Notices page with the count of new notices (none shown when 0). */
export function NoticeBell({ unseen }: { unseen: number }) {
  const label = unseen ? `Notices, ${unseen} new` : 'Notices, none new';
  return (
    <AppLink
      href="/notices"
      aria-label={label}
      title={label}
      className="relative inline-flex size-9 items-center justify-center rounded-md text-ink-100 hover:bg-ink-800"
    >
      <svg
        aria-hidden="true"
        viewBox="0 0 24 24"
        className="size-5"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
      >
        <path d="M6 16V11a6 6 0 1 1 12 0v5l1.5 2h-15z" strokeLinejoin="round" />
        <path d="M10 20a2 2 0 0 0 4 0" strokeLinecap="round" />
      </svg>
      {unseen ? (
        <span
          data-testid="notice-count"
          className="absolute -right-1 -top-1 min-w-5 rounded-full bg-amber-400 px-1 text-center text-xs font-semibold leading-5 text-ink-950"
        >
          {unseen > 99 ? '99+' : unseen}
        </span>
      ) : null}
    </AppLink>
  );
}
