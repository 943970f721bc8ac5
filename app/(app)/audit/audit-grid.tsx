'use client';

import type { ColDef } from 'ag-grid-community';
import { useMemo, useState } from 'react';
import { DataGrid } from '@/components/ui/data-grid';
import {
  changeLine,
  eventKindLabel,
  fieldChanges,
  objectKindLabel,
  type NameLookup,
} from '@/lib/audit/field-labels';
import type { AuditRow } from '@/lib/audit/search';
import { formatInZone } from '@/lib/domain/time-zone';

const orDash = (value: unknown) =>
  value === null || value === undefined || value === '' ? '—' : String(value);

/** A text closed by one full stop, whether or not it already ends with one. */
const sentence = (text: string) => (/[.!?]$/.test(text) ? text : `${text}.`);

/** Who acted, in words: name and today's roles, or that nobody was signed in. */
const person = (row: AuditRow) =>
  row.actorName ? `${row.actorName}${row.actorRoles ? ` (${row.actorRoles})` : ''}` : 'Nobody signed in';

/** The object in words: its kind and its name; a record since gone is said so, never shown by its id. */
const object = (row: AuditRow) => {
  const kind = objectKindLabel(row.entityType);
  if (row.objectName) return `${kind} ${row.objectName}`;
  return row.entityId ? `${kind} (no longer known)` : kind;
};

function columnsFor(timeZone: string, names: NameLookup): ColDef<AuditRow>[] {
  return [
    {
      field: 'occurredAt',
      headerName: `When (${timeZone})`,
      valueFormatter: (p) => formatInZone(p.value as string, timeZone),
      flex: 1.3,
      minWidth: 130,
      wrapText: true,
      autoHeight: true,
    },
    {
      colId: 'actor',
      headerName: 'Person',
      valueGetter: (p) => (p.data ? person(p.data) : ''),
      tooltipValueGetter: (p) => p.data?.actorEmail ?? null,
      flex: 1,
      minWidth: 110,
      wrapText: true,
      autoHeight: true,
    },
    {
      colId: 'action',
      headerName: 'What happened',
      valueGetter: (p) => (p.data ? eventKindLabel(p.data.action) : ''),
      flex: 1,
      minWidth: 100,
      wrapText: true,
      autoHeight: true,
    },
    {
      colId: 'object',
      headerName: 'Object',
      valueGetter: (p) => (p.data ? object(p.data) : ''),
      flex: 1.1,
      minWidth: 110,
      wrapText: true,
      autoHeight: true,
    },
    {
      field: 'reason',
      headerName: 'Reason',
      flex: 1,
      minWidth: 100,
      wrapText: true,
      autoHeight: true,
      valueFormatter: (p) => orDash(p.value),
    },
    {
      colId: 'change',
      headerName: 'Changes (field: before → after)',
      valueGetter: (p) =>
        p.data
          ? fieldChanges(p.data.before, p.data.after, names).map(changeLine).join('\n') || 'no field changed'
          : '',
      flex: 2,
      minWidth: 170,
      wrapText: true,
      autoHeight: true,
      cellClass: 'text-xs whitespace-pre-line leading-5! py-2.5',
    },
  ];
}

// Wrapped cells read as lines of text, not lines spaced a whole row apart. A constant: a new object on
// each render would make the grid rebuild its columns (components/ui/data-grid.tsx).
const AUDIT_COLUMN_DEFAULTS: ColDef<AuditRow> = {
  filter: false,
  sortable: false,
  resizable: true,
  cellClass: 'leading-5! py-2.5',
};

/** One page of audit events, newest first (filtered on the server); a chosen row shows each change in full. */
export function AuditGrid({
  rows,
  names,
  timeZone,
}: {
  rows: AuditRow[];
  names: NameLookup;
  timeZone: string;
}) {
  const [chosen, setChosen] = useState<AuditRow | null>(null);
  const columns = useMemo(() => columnsFor(timeZone, names), [timeZone, names]);
  const changes = chosen ? fieldChanges(chosen.before, chosen.after, names) : [];
  return (
    <div className="space-y-4">
      <DataGrid<AuditRow>
        label="Audit events"
        rows={rows}
        columns={columns}
        getRowId={(p) => String(p.data.id)}
        defaultColDef={AUDIT_COLUMN_DEFAULTS}
        onRowClicked={(e) => setChosen(e.data ?? null)}
        onCellKeyDown={(e) => {
          if ((e.event as KeyboardEvent | undefined)?.key === 'Enter') setChosen(e.data ?? null);
        }}
        rowClass="cursor-pointer"
        // A page holds at most 100 events: the grid grows with its rows (wrapped cells make them tall), and
        // the page scrolls, so no row is cut at a fixed height.
        domLayout="autoHeight"
        height="auto"
      />
      <section aria-live="polite" aria-label="Chosen event" className="gw-card p-4">
        {chosen ? (
          <>
            <h2 className="text-base font-semibold">
              {eventKindLabel(chosen.action)}: {object(chosen)}
            </h2>
            <p className="mt-1 text-sm text-ink-700">
              {formatInZone(chosen.occurredAt, timeZone)} by{' '}
              {chosen.actorName ? `${person(chosen)} <${chosen.actorEmail}>` : 'nobody signed in'}
              {chosen.address ? ` from ${chosen.address}` : ''}. Reason: {sentence(orDash(chosen.reason))}
            </p>
            {changes.length ? (
              <table className="mt-3 w-full text-left text-sm">
                <thead className="text-ink-500">
                  <tr>
                    <th scope="col" className="py-1 pr-4 font-medium">
                      Field
                    </th>
                    <th scope="col" className="py-1 pr-4 font-medium">
                      Before
                    </th>
                    <th scope="col" className="py-1 font-medium">
                      After
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {changes.map((change) => (
                    <tr key={change.field} className="border-t border-ink-100 align-top">
                      <th scope="row" className="py-1 pr-4 font-medium">
                        {change.field}
                      </th>
                      <td className="py-1 pr-4 break-words">{change.before ?? '—'}</td>
                      <td className="py-1 break-words">{change.after ?? 'removed'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            ) : (
              <p className="mt-3 text-sm text-ink-700">No field changed.</p>
            )}
            <p className="mt-2 text-xs text-ink-500">
              Internal references and file fingerprints are left out here; the csv and xlsx downloads keep
              every value as recorded.
            </p>
          </>
        ) : (
          <p className="text-sm text-ink-700">
            Choose an event (click, or Enter on a row) to see each of its changes in full.
          </p>
        )}
      </section>
    </div>
  );
}
