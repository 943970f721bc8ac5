'use client';

import type {
  ColDef,
  RowDataUpdatedEvent,
  RowSelectionOptions,
  SelectionChangedEvent,
  SelectionColumnDef,
} from 'ag-grid-community';
import { useMemo, useState } from 'react';
import { useSWRConfig } from 'swr';
import { BusyButton } from '@/components/ui/busy-button';
import dynamic from 'next/dynamic';
import type { DataGridProps } from '@/components/ui/data-grid';
import { GRID_ALWAYS_SHOWN, type GridColumnChoice } from '@/lib/domain/grid-layouts';
import { exclusionSchema, type WellRowView, type WellsResponse } from '@/lib/validation/plates';
import { GridColumnsMenu } from './grid-columns-menu';
import { useGridLayout } from './use-grid-layout';
import { plateJobsKey } from './plate-jobs';
import { fitsKey, postJson, usePlateWells, wellsKey } from './plate-data';
import { MAP_MODES, MAP_MODE_LABEL, type MapMode } from './map-colours';
import { PlateMap } from './plate-map';

// ag-grid is a large script: it loads after the page is interactive, so the plate map answers first.
const DataGrid = dynamic(() => import('@/components/ui/data-grid').then((m) => m.DataGrid), {
  ssr: false,
  loading: () => (
    <p role="status" className="text-sm text-ink-500">
      Loading the wells grid…
    </p>
  ),
}) as <Row>(props: DataGridProps<Row>) => React.ReactNode;

const fmt = (digits: number) => (p: { value: unknown }) =>
  typeof p.value === 'number' ? p.value.toPrecision(digits) : '—';

// Full names with units in the headers; long ones wrap (defaultColDef below) and show whole on hover.
const COLUMNS = (
  [
    { field: 'position', headerName: 'Well', width: 84, pinned: 'left', lockPinned: true },
    { field: 'role', headerName: 'Role', width: 110 },
    { field: 'compound', headerName: 'Compound', width: 120 },
    {
      field: 'concentration_uM',
      headerName: 'Concentration (µM)',
      width: 130,
      type: 'numericColumn',
      valueFormatter: fmt(3),
    },
    {
      field: 'controlCurrent_pA',
      headerName: 'Control current (pA)',
      width: 130,
      type: 'numericColumn',
      valueFormatter: fmt(4),
    },
    {
      field: 'compoundCurrent_pA',
      headerName: 'Current with compound (pA)',
      width: 140,
      type: 'numericColumn',
      valueFormatter: fmt(4),
    },
    {
      field: 'fractionalBlock',
      headerName: 'Fractional block (%)',
      width: 120,
      type: 'numericColumn',
      valueFormatter: (p) => (typeof p.value === 'number' ? (p.value * 100).toFixed(1) : '—'),
    },
    {
      field: 'sealResistance_GOhm',
      headerName: 'Seal resistance (GΩ)',
      width: 125,
      type: 'numericColumn',
      valueFormatter: fmt(3),
    },
    {
      field: 'seriesResistance_MOhm',
      headerName: 'Series resistance (MΩ)',
      width: 125,
      type: 'numericColumn',
      valueFormatter: fmt(3),
    },
    {
      field: 'capacitance_pF',
      headerName: 'Capacitance (pF)',
      width: 120,
      type: 'numericColumn',
      valueFormatter: fmt(3),
    },
    {
      colId: 'qc',
      headerName: 'QC',
      flex: 1,
      minWidth: 220,
      valueGetter: (p) => p.data?.qcReasons.map((q) => q.message).join('; ') || 'passed',
      cellClass: (p) => (p.data?.qcReasons.length ? 'text-signal-fail' : 'text-signal-pass'),
      tooltipValueGetter: (p) => p.data?.qcReasons.map((q) => q.message).join('; ') || 'passed',
    },
    {
      colId: 'excluded',
      headerName: 'Excluded',
      width: 200,
      valueGetter: (p) => (p.data?.excluded ? `yes: ${p.data.exclusionReason}` : ''),
      tooltipValueGetter: (p) => (p.data?.excluded ? `yes: ${p.data.exclusionReason}` : null),
    },
  ] satisfies ColDef<WellRowView>[] as ColDef<WellRowView>[]
).map((c) => ({ headerTooltip: c.headerName, colId: c.field, ...c }));

// Long headers wrap and the header grows to hold them. Rows are filtered by the QC choice above the grid,
// not in the headers. A constant: a new object on a render would rebuild the columns in their defined
// order, undoing a column the person moved (components/ui/data-grid.tsx).
const WELL_COLUMN_DEFAULTS: ColDef<WellRowView> = {
  wrapHeaderText: true,
  autoHeaderHeight: true,
  sortable: true,
  resizable: true,
  filter: false,
};

// Wells are picked by their boxes only. Constants, as above: the grid is not reconfigured on each render.
const WELL_SELECTION: RowSelectionOptions<WellRowView> = {
  mode: 'multiRow',
  checkboxes: true,
  headerCheckbox: true,
  enableClickSelection: false,
};
// The boxes stay beside the pinned well column when the grid scrolls sideways.
const WELL_SELECTION_COLUMN: SelectionColumnDef = { pinned: 'left' };

const COLUMN_NAMES = Object.fromEntries(COLUMNS.map((c) => [c.colId!, c.headerName!]));

const QC_ANY = '';
const QC_PASSED = ':passed';
const QC_FAILED = ':failed';

/** The target, and the readout when it is the use-dependent one, as the target choice names it. */
const readoutChoice = (w: WellRowView): string =>
  w.readout === 'use_dependent' ? `${w.target} · use-dependent` : w.target;

/** Plate map and wells grid of one target, with exclusion and re-inclusion of selected wells. */
export function WellsPanel({
  plateId,
  format,
  canEdit,
  initialMode = 'block',
  initialLayout = null,
  initialWells,
}: {
  plateId: string;
  format: number;
  canEdit: boolean;
  /** The colouring the map opens on: compound for someone who verifies the compound map. */
  initialMode?: MapMode;
  /** The person's own column choice of the wells grid, kept on the server; null for the grid's own. */
  initialLayout?: GridColumnChoice[] | null;
  /** The wells as the server rendered the page: the map draws at once, without a fetch. */
  initialWells?: WellsResponse;
}) {
  const { data, error, isLoading } = usePlateWells(plateId, initialWells);
  const { mutate } = useSWRConfig();
  // A target with a use-dependent readout is shown once per readout (exclusions still act on the well).
  const targets = useMemo(() => [...new Set(data?.wells.map(readoutChoice))], [data]);
  const [target, setTarget] = useState<string | null>(null);
  const [colouring, setColouring] = useState<MapMode>(initialMode);
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [reason, setReason] = useState('');
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState<'exclude' | 'include' | null>(null);
  const [qcFilter, setQcFilter] = useState(QC_ANY);
  const columnChoice = useGridLayout<WellRowView>('plate-wells', COLUMNS, initialLayout);

  if (error)
    return (
      <p role="alert" className="text-signal-fail">
        The wells could not be loaded: {error.message}
      </p>
    );
  if (isLoading || !data)
    return (
      <p role="status" className="text-sm text-ink-500">
        Loading wells…
      </p>
    );
  const current = target ?? targets[0] ?? '';
  const wells = data.wells.filter((w) => readoutChoice(w) === current);
  // The QC reasons of this target's wells, by code, for the grid's filter.
  const reasons = [...new Map(wells.flatMap((w) => w.qcReasons.map((q) => [q.code, q.message]))).entries()];
  const gridRows = wells.filter((w) =>
    qcFilter === QC_ANY
      ? true
      : qcFilter === QC_PASSED
        ? w.qcReasons.length === 0
        : qcFilter === QC_FAILED
          ? w.qcReasons.length > 0
          : w.qcReasons.some((q) => q.code === qcFilter),
  );
  const editable = canEdit && ['imported', 'verified', 'rejected'].includes(data.state);
  const toggle = (id: string) =>
    setSelected((s) => {
      const next = new Set(s);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  async function apply(excluded: boolean) {
    const parsed = exclusionSchema.safeParse({
      wellIds: [...selected],
      excluded,
      reason,
      expectedVersion: data!.version,
    });
    if (!parsed.success)
      return setMessage({ ok: false, text: parsed.error.issues.map((i) => i.message).join(' ') });
    setBusy(excluded ? 'exclude' : 'include');
    try {
      const result = await postJson<{ changed: number }>(`/api/plates/${plateId}/exclusions`, parsed.data);
      setMessage({
        ok: true,
        text: `${result.changed} well(s) ${excluded ? 'excluded' : 're-included'}; QC recomputed${result.changed ? ', fits queued for a refit' : ''}.`,
      });
      setSelected(new Set());
      setReason('');
      await Promise.all([mutate(wellsKey(plateId)), mutate(fitsKey(plateId)), mutate(plateJobsKey(plateId))]);
    } catch (e) {
      setMessage({ ok: false, text: e instanceof Error ? e.message : 'The change failed.' });
    } finally {
      setBusy(null);
    }
  }

  return (
    <section className="space-y-4" aria-labelledby="wells-heading">
      <div className="flex flex-wrap items-end gap-4">
        <h2 id="wells-heading" className="mr-auto text-lg font-semibold">
          Plate map and wells
        </h2>
        <label className="text-sm">
          Target{' '}
          <select
            className="gw-input inline-block w-auto"
            value={current}
            onChange={(e) => {
              setTarget(e.target.value);
              setSelected(new Set());
            }}
          >
            {targets.map((t) => (
              <option key={t}>{t}</option>
            ))}
          </select>
        </label>
        <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
          <legend className="float-left mr-1 text-ink-500">Colour wells by</legend>
          {MAP_MODES.map((mode) => (
            <label key={mode} className="inline-flex items-center gap-1">
              <input
                type="radio"
                name="colouring"
                checked={colouring === mode}
                onChange={() => setColouring(mode)}
              />
              {MAP_MODE_LABEL[mode]}
            </label>
          ))}
        </fieldset>
      </div>
      <PlateMap
        format={format}
        wells={wells}
        mode={colouring}
        label={`Plate map of ${current}, ${format} wells`}
        selected={selected}
        onToggle={editable ? toggle : undefined}
      />
      {editable ? (
        <div className="gw-card flex flex-wrap items-end gap-3 p-4">
          <p className="text-sm font-medium">{selected.size} well(s) selected</p>
          <div className="min-w-64 flex-1">
            <label htmlFor="exclusion-reason" className="gw-label">
              Reason (required, kept in the audit trail)
            </label>
            <input
              id="exclusion-reason"
              className="gw-input mt-1"
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              placeholder="e.g. seal lost during compound addition"
            />
          </div>
          <BusyButton
            busy={busy === 'exclude'}
            busyLabel="Excluding…"
            disabled={busy !== null || selected.size === 0}
            onClick={() => apply(true)}
          >
            Exclude
          </BusyButton>
          <BusyButton
            className="gw-button-quiet"
            busy={busy === 'include'}
            busyLabel="Re-including…"
            disabled={busy !== null || selected.size === 0}
            onClick={() => apply(false)}
          >
            Re-include
          </BusyButton>
          <p
            role="status"
            aria-live="polite"
            className={`w-full text-sm ${message?.ok ? 'text-signal-pass' : 'text-signal-fail'}`}
          >
            {message?.text}
          </p>
        </div>
      ) : (
        <p className="text-sm text-ink-700">
          {data.state === 'approved'
            ? 'This plate is approved and locked: wells can no longer be excluded.'
            : canEdit
              ? 'The plate is awaiting approval; wells change again only if it is returned.'
              : 'Only a biologist excludes or re-includes wells.'}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-4 text-sm">
        <label>
          Wells by QC{' '}
          <select
            className="gw-input inline-block w-auto"
            value={qcFilter}
            onChange={(e) => setQcFilter(e.target.value)}
          >
            <option value={QC_ANY}>All wells</option>
            <option value={QC_PASSED}>QC passed</option>
            <option value={QC_FAILED}>QC failed, any reason</option>
            {reasons.map(([code, message]) => (
              <option key={code} value={code}>
                Failed: {message}
              </option>
            ))}
          </select>
        </label>
        <p role="status" className="text-ink-700">
          {gridRows.length} of {wells.length} wells shown
        </p>
      </div>
      <GridColumnsMenu
        layout={columnChoice.layout}
        names={COLUMN_NAMES}
        alwaysShown={GRID_ALWAYS_SHOWN['plate-wells']}
        own={columnChoice.own}
        status={columnChoice.status}
        resetting={columnChoice.resetting}
        onShow={columnChoice.show}
        onMove={columnChoice.move}
        onReset={() => void columnChoice.reset()}
      />
      <DataGrid<WellRowView>
        key={columnChoice.gridKey}
        label={`Wells of ${current}`}
        rows={gridRows}
        defaultColDef={WELL_COLUMN_DEFAULTS}
        tooltipShowDelay={300}
        // Twelve columns: all drawn, so that every cell's text is in the page whatever the scroll.
        suppressColumnVirtualisation
        columns={columnChoice.columns}
        {...columnChoice.gridEvents}
        height={480}
        getRowId={(p) => p.data.readoutId}
        // Wells are picked only where they can be excluded: a locked plate's grid has no selection boxes.
        {...(editable
          ? {
              rowSelection: WELL_SELECTION,
              selectionColumnDef: WELL_SELECTION_COLUMN,
              onSelectionChanged: (e: SelectionChangedEvent<WellRowView>) =>
                setSelected(new Set(e.api.getSelectedRows().map((r) => r.id))),
              onRowDataUpdated: (e: RowDataUpdatedEvent<WellRowView>) =>
                e.api.forEachNode((node) =>
                  node.setSelected(Boolean(node.data && selected.has(node.data.id))),
                ),
            }
          : {})}
      />
    </section>
  );
}
