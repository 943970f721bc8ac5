'use client';

import {
  AllCommunityModule,
  ModuleRegistry,
  themeQuartz,
  type ColDef,
  type GridOptions,
} from 'ag-grid-community';
import { AgGridReact } from 'ag-grid-react';
import { useMemo } from 'react';
import { useStyleNonce } from './csp-context';

ModuleRegistry.registerModules([AllCommunityModule]);

/** Gatewell's grid look: the palette of app/globals.css on ag-grid's base theme. */
export const gatewellGridTheme = themeQuartz.withParams({
  fontFamily: 'var(--font-plex-sans), ui-sans-serif, system-ui, sans-serif',
  fontSize: 13,
  foregroundColor: '#12202f',
  backgroundColor: '#ffffff',
  headerBackgroundColor: '#eef2f5',
  headerTextColor: '#2b4157',
  accentColor: '#0f7479',
  borderColor: '#e3e9ef',
  rowHoverColor: '#f6f5f1',
  selectedRowBackgroundColor: '#d7efee',
  spacing: 6,
  wrapperBorderRadius: 8,
});

export interface DataGridProps<Row> extends Omit<GridOptions<Row>, 'theme' | 'rowData' | 'columnDefs'> {
  rows: Row[];
  columns: ColDef<Row>[];
  /** Accessible name of the grid. */
  label: string;
  height?: number | string;
}

/**
 * An ag-grid with Gatewell's theme, keyboard navigation and an accessible name. Pass `columns` and
 * `defaultColDef` that keep their identity between renders (module constants or memoised): ag-grid
 * rebuilds its columns whenever either is a new object, and a rebuild puts them back in the order of the
 * definitions, undoing a column the person moved.
 */
export function DataGrid<Row>({
  rows,
  columns,
  label,
  height = 520,
  defaultColDef: ownDefaults,
  ...options
}: DataGridProps<Row>) {
  // The theme's style tags carry the CSP nonce (lib/security/content-security-policy.ts).
  const styleNonce = useStyleNonce();
  const defaultColDef = useMemo<ColDef<Row>>(
    () => ({ sortable: true, resizable: true, filter: true, ...ownDefaults }),
    [ownDefaults],
  );
  return (
    <div role="region" aria-label={label} style={{ height }} className="w-full">
      <AgGridReact<Row>
        theme={gatewellGridTheme}
        rowData={rows}
        columnDefs={columns}
        defaultColDef={defaultColDef}
        ensureDomOrder
        enableCellTextSelection
        styleNonce={styleNonce}
        {...options}
      />
    </div>
  );
}
