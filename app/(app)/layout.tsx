import type { ReactNode } from 'react';
import { AppShell } from '@/components/shell/app-shell';
import { requireActor } from '@/lib/auth/current-actor';

export default async function SignedInLayout({ children }: { children: ReactNode }) {
  const actor = await requireActor();
  return <AppShell actor={actor}>{children}</AppShell>;
}
