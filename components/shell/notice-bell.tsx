'use client';

import { useEffect, useState } from 'react';
import { z } from 'zod';
import { AppLink } from '@/components/ui/app-link';

/** How often an open page asks for the count of new notices. */
export const NOTICE_COUNT_EVERY_MS = 30_000;

const countSchema = z.object({ unseen: z.number().int().min(0) });

/**
 * The header's bell: a link to the Notices page with the count of new notices (none shown when 0). The
 * count stays live without a reload: the page asks `/api/notices/unseen` every 30 s while it is in view
 * and at once when the window comes back into view; each server render brings the count too.
 */
export function NoticeBell({ unseen: rendered }: { unseen: number }) {
  // The count of the last server render, and one asked for since (null: none since that render).
  const [base, setBase] = useState(rendered);
  const [asked, setAsked] = useState<number | null>(null);
  // A navigation renders the layout again: its count is the newest.
  if (base !== rendered) {
    setBase(rendered);
    setAsked(null);
  }
  const unseen = asked ?? rendered;

  useEffect(() => {
    let stopped = false;
    let asking = false;
    const ask = async () => {
      if (stopped || asking || document.visibilityState === 'hidden') return;
      asking = true;
      try {
        const response = await fetch('/api/notices/unseen', { headers: { accept: 'application/json' } });
        // A session that has ended: the next page the person opens sends them to sign-in.
        if (response.status === 401) return void (stopped = true);
        if (!response.ok) return;
        const parsed = countSchema.safeParse(await response.json().catch(() => null));
        if (parsed.success && !stopped) setAsked(parsed.data.unseen);
      } catch {
        // Offline for a moment: the next tick asks again.
      } finally {
        asking = false;
      }
    };
    const timer = setInterval(() => void ask(), NOTICE_COUNT_EVERY_MS);
    const onView = () => void ask();
    window.addEventListener('focus', onView);
    document.addEventListener('visibilitychange', onView);
    return () => {
      stopped = true;
      clearInterval(timer);
      window.removeEventListener('focus', onView);
      document.removeEventListener('visibilitychange', onView);
    };
  }, []);

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
          aria-live="polite"
          className="absolute -right-1 -top-1 min-w-5 rounded-full bg-amber-400 px-1 text-center text-xs font-semibold leading-5 text-ink-950"
        >
          {unseen > 99 ? '99+' : unseen}
        </span>
      ) : null}
    </AppLink>
  );
}
