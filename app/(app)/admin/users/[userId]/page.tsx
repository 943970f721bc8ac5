import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { notFound } from 'next/navigation';
import type { ReactNode } from 'react';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { MIN_PASSWORD_LENGTH } from '@/lib/auth/password-policy';
import { isAppError } from '@/lib/errors';
import { getUser } from '@/lib/users/list';
import { changeRolesAction, resetPasswordAction, setUserStatusAction } from '../actions';
import { ResetPasswordForm } from './reset-password-form';
import { RolesForm } from './roles-form';
import { StatusForm } from './status-form';

export const metadata: Metadata = { title: 'User' };

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const formatTime = (value: string | null) => (value ? `${when.format(new Date(value))} UTC` : 'never');

function Panel({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section className="gw-card p-5" aria-labelledby={id}>
      <h2 id={id} className="mb-3 text-lg font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

export default async function UserPage({ params }: { params: Promise<{ userId: string }> }) {
  const actor = await requirePageRole(...rolesFor('manageUsers'));
  const user = await getUser(actor, (await params).userId).catch((error: unknown) => {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  });
  const self = user.id === actor.id;
  return (
    <>
      <PageHeader
        title={user.name}
        intro={`${user.email} · ${user.disabledAt ? `disabled ${formatTime(user.disabledAt)}` : 'enabled'} · last sign-in ${formatTime(user.lastSignInAt)} · password changed ${formatTime(user.passwordChangedAt)}`}
        actions={
          <>
            <AppLink href={`/audit?entityType=user&entityId=${user.id}`} className="gw-button-quiet">
              Audit trail of this account
            </AppLink>
            <AppLink href="/admin/users" className="gw-button-quiet">
              Back to users
            </AppLink>
          </>
        }
      />
      <div className="grid gap-4 xl:grid-cols-2">
        <Panel id="roles-heading" title="Roles">
          <RolesForm action={changeRolesAction} userId={user.id} roles={user.roles} />
        </Panel>
        <div className="space-y-4">
          <Panel id="status-heading" title="Access">
            {self ? (
              <p className="text-sm text-ink-700">This is your own account. Another admin can disable it.</p>
            ) : (
              <StatusForm action={setUserStatusAction} userId={user.id} enabled={!user.disabledAt} />
            )}
          </Panel>
          <Panel id="password-heading" title="Password">
            {self ? (
              <p className="text-sm text-ink-700">
                Change your own password on your{' '}
                <AppLink href="/account" className="text-lagoon-700 underline">
                  Account
                </AppLink>{' '}
                page; it asks for the current one.
              </p>
            ) : (
              <ResetPasswordForm
                action={resetPasswordAction}
                userId={user.id}
                userName={user.name}
                minPasswordLength={MIN_PASSWORD_LENGTH}
              />
            )}
          </Panel>
        </div>
      </div>
    </>
  );
}
