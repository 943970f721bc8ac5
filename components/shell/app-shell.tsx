import type { ReactNode } from 'react';
import type { Actor } from '@/lib/auth/roles';
import { navItemsFor } from './nav-items';
import { NavLinks } from './nav-links';
import { NoticeBell } from './notice-bell';

/**
 * The frame of every signed-in page: navigation, the bell with the count of new notices, the signed-in
 * person and their roles, sign-out.
 * The sign-out action comes from the layout, so that components import no app code.
 */
export function AppShell({
  actor,
  unseenNotices,
  signOut,
  children,
}: {
  actor: Actor;
  /** How many of the person's notices are new (lib/notices/service.ts). */
  unseenNotices: number;
  signOut: () => Promise<void>;
  children: ReactNode;
}) {
  return (
    <div className="min-h-screen lg:grid lg:grid-cols-[15rem_1fr]">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="bg-ink-950 text-ink-100 lg:sticky lg:top-0 lg:flex lg:h-screen lg:flex-col">
        <div className="flex items-center justify-between gap-4 px-4 py-3 lg:px-5 lg:py-6">
          <div>
            <p className="text-lg font-semibold tracking-wide text-white">Gatewell</p>
            <p className="text-xs text-ink-300 lg:mt-1">Ion-channel screening</p>
          </div>
          <NoticeBell unseen={unseenNotices} />
        </div>
        <nav aria-label="Main" className="px-2 pb-2 lg:flex-1 lg:px-3">
          <NavLinks items={navItemsFor(actor.roles)} />
        </nav>
        <div className="hidden border-t border-ink-800 px-5 py-4 text-sm lg:block">
          <p className="font-medium text-white">{actor.name}</p>
          <p className="text-xs text-ink-300">{actor.roles.join(', ') || 'no role'}</p>
          <form action={signOut} className="mt-3">
            <button
              type="submit"
              className="rounded-md border border-ink-700 px-3 py-1.5 text-xs font-medium text-ink-100 hover:bg-ink-800"
            >
              Sign out
            </button>
          </form>
        </div>
      </header>
      <div className="min-w-0">
        <div className="flex items-center justify-end gap-3 border-b border-ink-100 bg-card px-4 py-2 text-sm lg:hidden">
          <span>{actor.name}</span>
          <form action={signOut}>
            <button type="submit" className="gw-button-quiet px-3 py-1">
              Sign out
            </button>
          </form>
        </div>
        <main id="main" className="mx-auto max-w-7xl px-4 py-6 lg:px-8 lg:py-8">
          {children}
        </main>
      </div>
    </div>
  );
}
