'use client';

import type { ColDef } from 'ag-grid-community';
import type { ReactNode } from 'react';
import { DataGrid } from '@/components/ui/data-grid';
import type { Preview } from './import-api';

interface PreviewGridRow {
  row: number;
  status: string;
  well: string | null;
  compound: string | null;
  concentration_uM: number | null;
  target: string | null;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  sealResistance_GOhm: number | null;
  notes: string;
}

const num = (digits: number) => (p: { value: unknown }) =>
  typeof p.value === 'number' ? p.value.toPrecision(digits) : '—';

const COLUMNS: ColDef<PreviewGridRow>[] = [
  { field: 'row', headerName: 'Row', width: 80, type: 'numericColumn' },
  {
    field: 'status',
    headerName: 'Result',
    width: 120,
    cellClass: (p) =>
      p.value === 'error'
        ? 'text-signal-fail font-semibold'
        : p.value === 'QC flag'
          ? 'text-signal-warn font-semibold'
          : 'text-signal-pass',
  },
  { field: 'well', headerName: 'Well', width: 80 },
  { field: 'compound', headerName: 'Compound', width: 120 },
  {
    field: 'concentration_uM',
    headerName: 'Conc. (µM)',
    width: 120,
    type: 'numericColumn',
    valueFormatter: num(3),
  },
  { field: 'target', headerName: 'Target', width: 100 },
  {
    field: 'controlCurrent_pA',
    headerName: 'Control (pA)',
    width: 120,
    type: 'numericColumn',
    valueFormatter: num(4),
  },
  {
    field: 'compoundCurrent_pA',
    headerName: 'Compound (pA)',
    width: 130,
    type: 'numericColumn',
    valueFormatter: num(4),
  },
  {
    field: 'sealResistance_GOhm',
    headerName: 'Seal (GΩ)',
    width: 110,
    type: 'numericColumn',
    valueFormatter: num(3),
  },
  { field: 'notes', headerName: 'Messages', flex: 1, minWidth: 320, wrapText: true, autoHeight: true },
];

/**
 * The headline counts. A file of one plate: its rows, format and wells. A file of several plates: the
 * whole file's totals (sums over its plates) and their formats, each plate's own facts in `platesPanel`.
 */
function headline(preview: Preview): [string, string | number][] {
  const { summary, plates } = preview;
  if (plates.length <= 1)
    return [
      ['Rows read', summary.rows],
      ['Rows ready', summary.okRows],
      ['Rows with errors', summary.errorRows],
      ['Plate format', preview.plate ? `${preview.plate.format} (${preview.plate.formatSource})` : '—'],
      ['Wells', preview.plate?.wells.length ?? 0],
    ];
  const formats = [...new Set(plates.map((p) => p.format).filter((f) => f !== null))];
  return [
    ['Plates', plates.length],
    ['Wells, all plates', plates.reduce((n, p) => n + p.wellCount, 0)],
    ['Rows read, all plates', summary.rows],
    ['Rows with errors, all plates', summary.errorRows],
    [formats.length > 1 ? 'Plate formats' : 'Plate format', formats.join(', ') || '—'],
  ];
}

/**
 * The preview: counts, whole-file problems with what to do, the QC rules not applied, and every row
 * with its parse result and QC flags (for a file of several plates, the first plate's rows, said so).
 */
export function PreviewStep({
  preview,
  unknownCompoundsPanel,
  platesPanel,
}: {
  preview: Preview;
  /** Shown instead of the plain list of unregistered compounds (unknown-compounds.tsx). */
  unknownCompoundsPanel?: ReactNode;
  /** Each plate's facts, under the headline, for a file of several plates (plates-in-file.tsx). */
  platesPanel?: ReactNode;
}) {
  const rows: PreviewGridRow[] = preview.rows.map((r) => {
    const qc = preview.qc[String(r.row)] ?? [];
    const status = r.status === 'error' ? 'error' : qc.length ? 'QC flag' : 'ok';
    return {
      row: r.row,
      status,
      well: r.values.well,
      compound: r.values.compound,
      concentration_uM: r.values.concentration_uM,
      target: r.values.target,
      controlCurrent_pA: r.values.controlCurrent_pA,
      compoundCurrent_pA: r.values.compoundCurrent_pA,
      sealResistance_GOhm: r.values.sealResistance_GOhm,
      notes: [
        ...r.issues.map((i) => i.message.replace(/^Sheet "[^"]*", row \d+, /, '')),
        ...qc.map((q) => `QC: ${q}`),
      ].join(' · '),
    };
  });
  const several = preview.plates.length > 1;
  const firstPlate = preview.plates[0];
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-5" aria-label="Check totals">
        {headline(preview).map(([label, value]) => (
          <div key={String(label)} className="gw-card p-3">
            <dt className="text-xs text-ink-500">{label}</dt>
            <dd className="text-lg font-semibold tabular-nums">{value}</dd>
          </div>
        ))}
      </dl>
      {several ? platesPanel : null}
      {preview.fileProblems.length ? (
        <section
          role="alert"
          aria-labelledby="file-problems-heading"
          className="space-y-2 rounded-md border border-red-200 bg-red-50 p-4 text-sm"
        >
          <h3 id="file-problems-heading" className="font-semibold text-signal-fail">
            This file cannot be stored yet
          </h3>
          <ul className="space-y-2">
            {preview.fileProblems.map((p) => (
              <li key={p.message}>
                <p className="text-signal-fail">{p.message}</p>
                <p className="text-ink-700">
                  <span className="font-medium">What to do:</span> {p.whatToDo}
                </p>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {preview.qcRulesNotApplied.length ? (
        <section
          aria-labelledby="rules-not-applied-heading"
          className="space-y-1 rounded-md border border-amber-200 bg-amber-50 p-3 text-sm"
        >
          <h3 id="rules-not-applied-heading" className="font-semibold text-signal-warn">
            QC rules not applied
          </h3>
          <ul className="space-y-1 text-ink-700">
            {preview.qcRulesNotApplied.map((r) => (
              <li key={r.rule}>{r.message}</li>
            ))}
          </ul>
        </section>
      ) : null}
      {preview.unknownCompounds.length && unknownCompoundsPanel ? unknownCompoundsPanel : null}
      {preview.unknownCompounds.length && !unknownCompoundsPanel ? (
        <p className="rounded-md border border-amber-200 bg-amber-50 p-3 text-sm text-signal-warn">
          Not registered:{' '}
          {preview.unknownCompounds
            .map(
              (c) => `${c.identifier} (rows ${c.rows.slice(0, 5).join(', ')}${c.rows.length > 5 ? '…' : ''})`,
            )
            .join('; ')}
          . A chemist registers them on the Compounds page; then check the rows again.
        </p>
      ) : null}
      {rows.length && several && firstPlate ? (
        <p className="text-sm text-ink-700">
          The rows below are those of plate <span className="font-medium">{firstPlate.label}</span>, the first
          of the file&rsquo;s {preview.plates.length} plates; the list above counts every plate.
        </p>
      ) : null}
      {rows.length ? (
        <DataGrid<PreviewGridRow>
          label={several ? 'Preview of the first plate’s rows' : 'Preview of every row'}
          rows={rows}
          columns={COLUMNS}
          height={460}
          getRowId={(p) => String(p.data.row)}
        />
      ) : null}
    </div>
  );
}
