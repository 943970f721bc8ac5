'use client';

import type { ColDef, ICellRendererParams } from 'ag-grid-community';
import { AppLink } from '@/components/ui/app-link';
import { useRouter } from 'next/navigation';
import { DataGrid } from '@/components/ui/data-grid';
import type { UserSummary } from '@/lib/users/records';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const formatTime = (value: string | null | undefined) =>
  value ? `${when.format(new Date(value))} UTC` : '—';

function NameCell({ data }: ICellRendererParams<UserSummary>) {
  if (!data) return null;
  return (
    <AppLink
      href={`/admin/users/${data.id}`}
      className="font-medium text-lagoon-700 underline-offset-2 hover:underline"
    >
      {data.name}
    </AppLink>
  );
}

function StatusCell({ data }: ICellRendererParams<UserSummary>) {
  if (!data) return null;
  return data.disabledAt ? (
    <span className="rounded-full bg-red-50 px-2 py-0.5 text-xs font-medium text-signal-fail ring-1 ring-red-300">
      Disabled
    </span>
  ) : (
    <span className="rounded-full bg-emerald-50 px-2 py-0.5 text-xs font-medium text-signal-pass ring-1 ring-emerald-300">
      Enabled
    </span>
  );
}

const columns: ColDef<UserSummary>[] = [
  { field: 'name', headerName: 'Name', cellRenderer: NameCell, flex: 1, minWidth: 150 },
  { field: 'email', headerName: 'E-mail', flex: 1.2, minWidth: 190 },
  {
    field: 'roles',
    headerName: 'Roles',
    valueFormatter: (p) => (p.value as string[]).join(', ') || 'none (read only)',
    flex: 1,
    minWidth: 130,
  },
  {
    colId: 'status',
    headerName: 'Status',
    valueGetter: (p) => (p.data?.disabledAt ? 'Disabled' : 'Enabled'),
    cellRenderer: StatusCell,
    width: 110,
  },
  {
    field: 'lastSignInAt',
    headerName: 'Last sign-in',
    valueFormatter: (p) => formatTime(p.value),
    width: 175,
  },
  {
    field: 'passwordChangedAt',
    headerName: 'Password changed',
    valueFormatter: (p) => formatTime(p.value),
    width: 175,
  },
];

/** Every account in a sortable, filterable grid; a click or Enter on a row opens the account. */
export function UsersGrid({ users }: { users: UserSummary[] }) {
  const router = useRouter();
  const open = (user: UserSummary | undefined) => user && router.push(`/admin/users/${user.id}`);
  return (
    <DataGrid<UserSummary>
      label="Users"
      rows={users}
      columns={columns}
      getRowId={(p) => p.data.id}
      onRowClicked={(e) => open(e.data)}
      onCellKeyDown={(e) => {
        if ((e.event as KeyboardEvent | undefined)?.key === 'Enter') open(e.data);
      }}
      rowClass="cursor-pointer"
      height={Math.min(640, 58 + users.length * 42)}
    />
  );
}
