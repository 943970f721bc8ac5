import { headers } from 'next/headers';
import { forbidden, redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { AppShell } from '@/components/shell/app-shell';
import { signOutAction } from '@/app/(auth)/sign-in/actions';
import { requireActor } from '@/lib/auth/current-actor';
import { PATHNAME_HEADER, rolesForPath } from '@/lib/auth/page-roles';
import { hasRole } from '@/lib/auth/roles';
import { unseenNoticeCount } from '@/lib/notices/service';

export default async function SignedInLayout({ children }: { children: ReactNode }) {
  const actor = await requireActor();
  // Refused here, before the page starts streaming, a page that needs a role answers 403.
  const pathname = (await headers()).get(PATHNAME_HEADER) ?? '';
  // A password an administrator set is for one sign-in: its owner chooses their own before anything else.
  if (actor.passwordChangeRequired && pathname !== '/account') redirect('/account');
  const needed = rolesForPath(pathname);
  if (needed && !hasRole(actor, ...needed)) forbidden();
  return (
    <AppShell actor={actor} unseenNotices={await unseenNoticeCount(actor)} signOut={signOutAction}>
      {children}
    </AppShell>
  );
}
