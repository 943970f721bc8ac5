import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { listUsers } from '@/lib/users/list';
import { UsersGrid } from './users-grid';

export const metadata: Metadata = { title: 'Users' };

export default async function UsersPage() {
  const actor = await requirePageRole(...rolesFor('manageUsers'));
  const users = await listUsers(actor);
  const enabled = users.filter((user) => !user.disabledAt).length;
  return (
    <>
      <PageHeader
        title="Users"
        intro={`${enabled} enabled and ${users.length - enabled} disabled accounts. Open an account to change its roles, disable it or set a new password.`}
        actions={
          <AppLink href="/admin/users/new" className="gw-button">
            Create user
          </AppLink>
        }
      />
      <UsersGrid users={users} />
    </>
  );
}
