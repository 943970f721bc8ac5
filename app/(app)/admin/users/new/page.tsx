import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { INVITATION_LIFETIME_MS } from '@/lib/auth/password-link';
import { MIN_PASSWORD_LENGTH } from '@/lib/auth/password-policy';
import { createUserAction } from '../actions';
import { CreateUserForm } from './create-user-form';

export const metadata: Metadata = { title: 'Create user' };

export default async function CreateUserPage() {
  await requirePageRole(...rolesFor('manageUsers'));
  return (
    <>
      <PageHeader
        title="Create user"
        intro="The new person signs in with their e-mail address: with the password they choose through an e-mailed link, or with an initial password you hand over, which they change at their first sign-in."
        actions={
          <AppLink href="/admin/users" className="gw-button-quiet">
            Back to users
          </AppLink>
        }
      />
      <section className="gw-card p-6">
        <CreateUserForm
          action={createUserAction}
          minPasswordLength={MIN_PASSWORD_LENGTH}
          invitationDays={INVITATION_LIFETIME_MS / 86_400_000}
        />
      </section>
    </>
  );
}
