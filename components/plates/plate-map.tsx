'use client';

import { useEffect, useMemo, useState, type KeyboardEvent } from 'react';
import type { WellRowView } from '@/lib/validation/plates';
import {
  MAP_MODE_LABEL,
  isDarkFill,
  mapContext,
  mapLegend,
  wellFill,
  type LegendItem,
  type MapMode,
} from './map-colours';

export type { MapMode } from './map-colours';

const GEOMETRY: Record<number, { rows: number; columns: number }> = {
  96: { rows: 8, columns: 12 },
  384: { rows: 16, columns: 24 },
  1536: { rows: 32, columns: 48 },
};

const rowLetter = (r: number) =>
  r < 26 ? String.fromCharCode(65 + r) : `A${String.fromCharCode(65 + r - 26)}`;

const ROLE_WORD = { vehicle: 'vehicle', reference: 'reference blocker', test: 'test compound' } as const;

function describe(w: WellRowView): string {
  const what =
    w.role === 'test' ? `${w.compound} at ${w.concentration_uM?.toPrecision(3)} µM` : ROLE_WORD[w.role];
  const block = w.fractionalBlock === null ? 'no block' : `block ${(w.fractionalBlock * 100).toFixed(0)} %`;
  const qc = w.qcReasons.length ? `QC: ${w.qcReasons.map((q) => q.message).join('; ')}` : 'QC passed';
  return `${w.position} · ${what} · ${block} · ${qc}${w.excluded ? ` · excluded: ${w.exclusionReason}` : ''}`;
}

const num = (v: number | null, digits: number, unit: string) =>
  v === null ? '—' : `${Number(v.toPrecision(digits))} ${unit}`;

/** The facts of one well as label and value, for the facts box beside the map. */
function wellFacts(w: WellRowView): [string, string][] {
  return [
    ['Well', w.position],
    ['Role', ROLE_WORD[w.role]],
    ['Compound', w.compound ?? '—'],
    ['Concentration', num(w.concentration_uM, 3, 'µM')],
    ['Target', w.target],
    ['Fractional block', w.fractionalBlock === null ? '—' : `${(w.fractionalBlock * 100).toFixed(1)} %`],
    ['Seal resistance', num(w.sealResistance_GOhm, 3, 'GΩ')],
    ['QC', w.qcReasons.length ? w.qcReasons.map((q) => q.message).join('; ') : 'passed'],
    ['Excluded', w.excluded ? `yes: ${w.exclusionReason ?? ''}` : 'no'],
  ];
}

/**
 * The plate as a grid of wells under one colouring, with its legend and the facts of the well under the
 * pointer or keyboard focus. Arrow keys (and Home/End) move; where wells may be picked (`onToggle`, never
 * on a locked plate) Enter, Space or a click selects.
 */
export function PlateMap({
  format,
  wells,
  mode,
  selected = new Set(),
  onToggle,
  label,
  onShow,
}: {
  format: number;
  wells: WellRowView[];
  mode: MapMode;
  selected?: ReadonlySet<string>;
  onToggle?: ((wellId: string) => void) | undefined;
  /** What the map shows, for its accessible name; its colouring is added. */
  label?: string;
  /**
   * Where the facts of the well under the pointer or focus go: given, the caller shows them (one box for
   * several maps); else a box beside the map shows them.
   */
  onShow?: (well: WellRowView | undefined) => void;
}) {
  const { rows, columns } = GEOMETRY[format] ?? GEOMETRY[96]!;
  const [focus, setFocus] = useState(0);
  const [hover, setHover] = useState<number | null>(null);
  const byCell = useMemo(
    () => new Map(wells.map((w) => [w.rowIndex * columns + w.columnIndex, w])),
    [wells, columns],
  );
  const context = useMemo(() => mapContext(wells), [wells]);
  const legend = useMemo(() => mapLegend(mode, context), [mode, context]);
  const cell = format === 96 ? 30 : format === 384 ? 18 : 12;
  const margin = 22;
  const width = margin + columns * cell + 2;
  const height = margin + rows * cell + 2;
  const focused = byCell.get(focus);
  const shown = byCell.get(hover ?? focus);
  useEffect(() => onShow?.(shown), [onShow, shown]);
  const labelSize = cell > 20 ? 10 : cell > 12 ? 8 : 6.5;
  const name = `${label ?? `Plate map, ${format} wells`}, coloured by ${MAP_MODE_LABEL[mode].toLowerCase()}`;

  function onKey(event: KeyboardEvent<SVGSVGElement>) {
    const moves: Record<string, number> = {
      ArrowRight: 1,
      ArrowLeft: -1,
      ArrowDown: columns,
      ArrowUp: -columns,
    };
    if (event.key in moves || event.key === 'Home' || event.key === 'End') {
      event.preventDefault();
      setHover(null);
      setFocus((f) => {
        if (event.key === 'Home') return f - (f % columns);
        if (event.key === 'End') return f - (f % columns) + columns - 1;
        const next = f + moves[event.key]!;
        // Left and right stay in the row; up and down stop at the plate's edge.
        if (
          (event.key === 'ArrowRight' || event.key === 'ArrowLeft') &&
          Math.floor(next / columns) !== Math.floor(f / columns)
        )
          return f;
        return next < 0 || next >= rows * columns ? f : next;
      });
    } else if ((event.key === 'Enter' || event.key === ' ') && focused && onToggle) {
      event.preventDefault();
      onToggle(focused.id);
    }
  }

  return (
    <figure
      className={`grid items-start gap-4 ${onShow ? '' : 'xl:grid-cols-[minmax(0,1fr)_15rem]'}`}
      data-map-mode={mode}
    >
      <div className="min-w-0 space-y-2">
        <svg
          viewBox={`0 0 ${width} ${height}`}
          className={`block h-auto w-full ${format === 96 ? 'max-w-2xl' : 'max-w-4xl'} rounded-md bg-card outline-none focus-visible:ring-3 focus-visible:ring-lagoon-500`}
          role="grid"
          aria-label={name}
          tabIndex={0}
          onKeyDown={onKey}
          onMouseLeave={() => setHover(null)}
          aria-activedescendant={focused ? `well-${focused.id}` : undefined}
        >
          {Array.from({ length: columns }, (_, c) => (
            <text
              key={`c${c}`}
              x={margin + c * cell + cell / 2}
              y={14}
              textAnchor="middle"
              fontSize={labelSize}
              fill="#51677d"
            >
              {c + 1}
            </text>
          ))}
          {Array.from({ length: rows }, (_, r) => (
            <text
              key={`r${r}`}
              x={10}
              y={margin + r * cell + cell / 2 + 3}
              textAnchor="middle"
              fontSize={labelSize}
              fill="#51677d"
            >
              {rowLetter(r)}
            </text>
          ))}
          {Array.from({ length: rows }, (_, r) => (
            <g key={`row${r}`} role="row">
              {Array.from({ length: columns }, (_, c) => {
                const i = r * columns + c;
                const w = byCell.get(i);
                const x = margin + c * cell;
                const y = margin + r * cell;
                const isSelected = w ? selected.has(w.id) : false;
                const fill = wellFill(w, mode, context);
                return (
                  <g
                    key={i}
                    id={w ? `well-${w.id}` : undefined}
                    role="gridcell"
                    aria-selected={w && onToggle ? isSelected : undefined}
                    aria-label={w ? describe(w) : `${rowLetter(r)}${c + 1}: no well`}
                    data-well={w?.position}
                    data-fill={w ? fill : undefined}
                    onMouseEnter={() => setHover(i)}
                    onClick={() => {
                      setFocus(i);
                      if (w) onToggle?.(w.id);
                    }}
                    className={w && onToggle ? 'cursor-pointer' : undefined}
                  >
                    <rect
                      x={x + 1}
                      y={y + 1}
                      width={cell - 2}
                      height={cell - 2}
                      rx={cell / 2.5}
                      fill={fill}
                      stroke={isSelected ? '#0b1622' : i === focus ? '#0b1622' : '#c7d1db'}
                      strokeWidth={isSelected ? 2 : i === focus ? 2.5 : 0.8}
                    />
                    {w?.excluded ? (
                      <line
                        x1={x + 3}
                        y1={y + cell - 3}
                        x2={x + cell - 3}
                        y2={y + 3}
                        stroke={isDarkFill(fill) ? '#ffffff' : '#2b4157'}
                        strokeWidth={1.2}
                      />
                    ) : null}
                    {w && w.role !== 'test' && cell >= 18 ? (
                      <text
                        x={x + cell / 2}
                        y={y + cell / 2 + 3}
                        textAnchor="middle"
                        fontSize={cell > 20 ? 10 : 8}
                        fontWeight={600}
                        fill={isDarkFill(fill) ? '#ffffff' : '#12202f'}
                      >
                        {w.role === 'vehicle' ? 'V' : 'R'}
                      </text>
                    ) : null}
                  </g>
                );
              })}
            </g>
          ))}
        </svg>
        <figcaption>
          <MapLegend items={legend} title={MAP_MODE_LABEL[mode]} marks={cell >= 18} />
        </figcaption>
      </div>
      {onShow ? null : <WellFactsBox well={shown} />}
    </figure>
  );
}

export function WellFactsBox({ well }: { well: WellRowView | undefined }) {
  return (
    <section aria-label="Well facts" className="gw-card p-3 text-sm" data-testid="well-facts">
      <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-500">Well facts</h3>
      {well ? (
        <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-1">
          {wellFacts(well).map(([k, v]) => (
            <div key={k} className="contents">
              <dt className="text-ink-500">{k}</dt>
              <dd className="break-words tabular-nums">{v}</dd>
            </div>
          ))}
        </dl>
      ) : (
        <p className="text-ink-500">Point at a well, or focus the map and move with the arrow keys.</p>
      )}
    </section>
  );
}

function MapLegend({ items, title, marks }: { items: LegendItem[]; title: string; marks: boolean }) {
  return (
    <div
      className="text-xs text-ink-700"
      aria-label={`Legend: ${title}`}
      role="group"
      data-testid="map-legend"
    >
      <ul className="flex flex-wrap items-center gap-x-4 gap-y-1.5">
        {items.map((item) => (
          <li key={item.label} className="inline-flex items-center gap-1.5">
            <svg aria-hidden width="12" height="12" viewBox="0 0 12 12" className="shrink-0">
              <circle cx="6" cy="6" r="5.5" fill={item.fill} stroke="#9aa9b8" strokeWidth="1" />
              {item.struck ? (
                <line x1="2.5" y1="9.5" x2="9.5" y2="2.5" stroke="#ffffff" strokeWidth="1.2" />
              ) : null}
            </svg>
            <span data-legend-fill={item.fill}>{item.label}</span>
          </li>
        ))}
        {marks ? <li>V vehicle · R reference blocker</li> : null}
      </ul>
    </div>
  );
}
