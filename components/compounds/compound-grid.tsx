'use client';

import type { ColDef } from 'ag-grid-community';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { DataGrid } from '@/components/ui/data-grid';
import type { CompoundSummary } from '@/lib/compounds/list';

const columns: ColDef<CompoundSummary>[] = [
  { field: 'identifier', headerName: 'Identifier', cellClass: 'font-mono font-medium', width: 150 },
  { field: 'name', headerName: 'Name', flex: 1, minWidth: 160 },
  { field: 'smiles', headerName: 'SMILES', flex: 2, minWidth: 200, cellClass: 'font-mono text-xs' },
  {
    field: 'molecularWeight',
    headerName: 'MW (g/mol)',
    width: 130,
    type: 'numericColumn',
    valueFormatter: (p) => (p.value == null ? '—' : Number(p.value).toFixed(2)),
  },
  { field: 'batchCount', headerName: 'Batches', width: 110, type: 'numericColumn' },
  { field: 'plateCount', headerName: 'Plates', width: 100, type: 'numericColumn' },
];

/** The registry in a searchable grid; Enter or a click on a row opens the compound. */
export function CompoundGrid({ compounds }: { compounds: CompoundSummary[] }) {
  const router = useRouter();
  const [search, setSearch] = useState('');
  return (
    <div className="space-y-3">
      <div className="max-w-sm">
        <label htmlFor="compound-search" className="gw-label">
          Search the registry
        </label>
        <input
          id="compound-search"
          type="search"
          value={search}
          onChange={(e) => setSearch(e.target.value)}
          placeholder="Identifier, name or SMILES"
          className="gw-input mt-1"
        />
      </div>
      <DataGrid<CompoundSummary>
        label="Registered compounds"
        rows={compounds}
        columns={columns}
        quickFilterText={search}
        getRowId={(p) => p.data.id}
        onRowClicked={(e) => e.data && router.push(`/compounds/${e.data.id}`)}
        onCellKeyDown={(e) => {
          const key = (e.event as KeyboardEvent | undefined)?.key;
          if (key === 'Enter' && e.data) router.push(`/compounds/${e.data.id}`);
        }}
        rowClass="cursor-pointer"
        height={Math.min(600, 56 + compounds.length * 42)}
      />
    </div>
  );
}
