'use client';

import type { ColDef, ValueFormatterParams } from 'ag-grid-community';
import { DataGrid } from '@/components/ui/data-grid';
import type { AuditRow } from '@/lib/audit/search';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium', timeZone: 'UTC' });
const json = (p: ValueFormatterParams<AuditRow>) => (p.value === null || p.value === undefined ? '—' : JSON.stringify(p.value, null, 1).replace(/\n\s*/g, ' '));
const wrapped = { wrapText: true, autoHeight: true, cellClass: 'font-mono text-xs leading-5 py-1' };

const columns: ColDef<AuditRow>[] = [
  { field: 'occurredAt', headerName: 'Time (UTC)', valueFormatter: (p) => when.format(new Date(p.value as string)), width: 185, sortable: false },
  { colId: 'actor', headerName: 'Person', valueGetter: (p) => p.data?.actorName ?? 'nobody signed in', tooltipValueGetter: (p) => p.data?.actorEmail ?? null, width: 160 },
  { field: 'action', headerName: 'Action', width: 150, cellClass: 'font-mono text-xs' },
  { field: 'entityType', headerName: 'Record', width: 110 },
  { field: 'entityId', headerName: 'Record id', width: 150, cellClass: 'font-mono text-xs', valueFormatter: (p) => p.value ?? '—' },
  { field: 'reason', headerName: 'Reason', flex: 1, minWidth: 160, wrapText: true, autoHeight: true, valueFormatter: (p) => p.value ?? '—' },
  { field: 'before', headerName: 'Before', flex: 1, minWidth: 200, valueFormatter: json, ...wrapped },
  { field: 'after', headerName: 'After', flex: 1, minWidth: 200, valueFormatter: json, ...wrapped },
];

/** One page of audit events, newest first; filtering happens on the server before the rows arrive. */
export function AuditGrid({ rows }: { rows: AuditRow[] }) {
  return (
    <DataGrid<AuditRow>
      label="Audit events"
      rows={rows}
      columns={columns}
      getRowId={(p) => String(p.data.id)}
      defaultColDef={{ filter: false, sortable: false, resizable: true }}
      height={640}
    />
  );
}
