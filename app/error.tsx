'use client';

import { RouteError } from '@/components/ui/route-error';

/** Failures the route groups' own boundaries cannot catch, such as a signed-in layout that cannot load its user. */
export default function RootError(props: { error: Error & { digest?: string }; retry: () => void }) {
  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <RouteError what="This page" {...props} />
    </main>
  );
}
