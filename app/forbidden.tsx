import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';

export const metadata: Metadata = { title: 'No access' };

/** Answered (HTTP 403) when a signed-in person opens a page their roles do not cover. */
export default function Forbidden() {
  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <div className="gw-card max-w-md p-8">
        <p className="text-sm font-semibold tracking-wide text-lagoon-700">Gatewell</p>
        <h1 className="mt-2 text-2xl font-semibold">No access to this page</h1>
        <p className="mt-2 text-sm text-ink-700">
          Your roles do not cover this page. If your work needs it, ask an administrator for the role.
        </p>
        <AppLink href="/" className="gw-button mt-5">
          Back to My work
        </AppLink>
      </div>
    </main>
  );
}
