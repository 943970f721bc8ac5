'use client';

import type { ColDef } from 'ag-grid-community';
import { useState } from 'react';
import { DataGrid } from '@/components/ui/data-grid';
import type { AuditRow } from '@/lib/audit/search';
import { changeSummary } from './change-summary';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium', timeZone: 'UTC' });
const orDash = (value: unknown) =>
  value === null || value === undefined || value === '' ? '—' : String(value);

const columns: ColDef<AuditRow>[] = [
  {
    field: 'occurredAt',
    headerName: 'Time (UTC)',
    valueFormatter: (p) => when.format(new Date(p.value as string)),
    width: 150,
  },
  {
    colId: 'actor',
    headerName: 'Person',
    valueGetter: (p) => p.data?.actorName ?? 'nobody signed in',
    tooltipValueGetter: (p) => p.data?.actorEmail ?? null,
    width: 125,
  },
  { field: 'action', headerName: 'Action', width: 130, cellClass: 'font-mono text-xs' },
  { field: 'entityType', headerName: 'Record', width: 90 },
  {
    field: 'entityId',
    headerName: 'Record id',
    width: 110,
    cellClass: 'font-mono text-xs',
    valueFormatter: (p) => orDash(p.value),
    tooltipField: 'entityId',
  },
  {
    field: 'reason',
    headerName: 'Reason',
    flex: 1,
    minWidth: 120,
    wrapText: true,
    autoHeight: true,
    valueFormatter: (p) => orDash(p.value),
  },
  {
    colId: 'change',
    headerName: 'Before → after',
    valueGetter: (p) => (p.data ? changeSummary(p.data.before, p.data.after) : ''),
    flex: 2,
    minWidth: 220,
    wrapText: true,
    autoHeight: true,
    cellClass: 'text-xs leading-5 py-1.5',
  },
];

function Values({ title, value }: { title: string; value: unknown }) {
  return (
    <div className="min-w-0 flex-1">
      <h3 className="text-sm font-semibold">{title}</h3>
      <pre className="mt-1 max-h-72 overflow-auto rounded bg-paper p-3 font-mono text-xs">
        {value === null || value === undefined ? '—' : JSON.stringify(value, null, 2)}
      </pre>
    </div>
  );
}

/** One page of audit events, newest first (filtered on the server); a chosen row shows its full before and after. */
export function AuditGrid({ rows }: { rows: AuditRow[] }) {
  const [chosen, setChosen] = useState<AuditRow | null>(null);
  return (
    <div className="space-y-4">
      <DataGrid<AuditRow>
        label="Audit events"
        rows={rows}
        columns={columns}
        getRowId={(p) => String(p.data.id)}
        defaultColDef={{ filter: false, sortable: false, resizable: true }}
        onRowClicked={(e) => setChosen(e.data ?? null)}
        onCellKeyDown={(e) => {
          if ((e.event as KeyboardEvent | undefined)?.key === 'Enter') setChosen(e.data ?? null);
        }}
        rowClass="cursor-pointer"
        height={Math.min(620, 60 + rows.length * 52)}
      />
      <section aria-live="polite" aria-label="Chosen event" className="gw-card p-4">
        {chosen ? (
          <>
            <h2 className="text-base font-semibold">
              Event {chosen.id}: <span className="font-mono">{chosen.action}</span> on {chosen.entityType}{' '}
              {chosen.entityId ?? ''}
            </h2>
            <p className="mt-1 text-sm text-ink-700">
              {when.format(new Date(chosen.occurredAt))} UTC by{' '}
              {chosen.actorName ? `${chosen.actorName} <${chosen.actorEmail}>` : 'nobody signed in'}
              {chosen.address ? ` from ${chosen.address}` : ''}. Reason: {orDash(chosen.reason)}.
            </p>
            <div className="mt-3 flex flex-col gap-4 md:flex-row">
              <Values title="Before" value={chosen.before} />
              <Values title="After" value={chosen.after} />
            </div>
          </>
        ) : (
          <p className="text-sm text-ink-700">
            Choose an event (click, or Enter on a row) to see its full before and after.
          </p>
        )}
      </section>
    </div>
  );
}
