'use client';

import { scaleLinear } from 'd3-scale';
import { useState, type KeyboardEvent } from 'react';
import type { WellRowView } from '@/lib/validation/plates';

export type MapColouring = 'block' | 'qc';

const GEOMETRY: Record<number, { rows: number; columns: number }> = {
  96: { rows: 8, columns: 12 },
  384: { rows: 16, columns: 24 },
  1536: { rows: 32, columns: 48 },
};
const blockColour = scaleLinear<string>()
  .domain([0, 0.5, 1])
  .range(['#f1efe6', '#5fb3b0', '#0b3f4a'])
  .clamp(true);
const QC_COLOUR = { pass: '#3f9a63', fail: '#c8402f', excluded: '#9fb0c1', empty: '#ffffff' } as const;

const rowLetter = (r: number) =>
  r < 26 ? String.fromCharCode(65 + r) : `A${String.fromCharCode(65 + r - 26)}`;

function describe(w: WellRowView): string {
  const what = w.role === 'test' ? `${w.compound} at ${w.concentration_uM?.toPrecision(3)} µM` : w.role;
  const block = w.fractionalBlock === null ? 'no block' : `block ${(w.fractionalBlock * 100).toFixed(0)} %`;
  const qc = w.qcReasons.length ? `QC: ${w.qcReasons.map((q) => q.message).join('; ')}` : 'QC passed';
  return `${w.position} · ${what} · ${block} · ${qc}${w.excluded ? ` · excluded: ${w.exclusionReason}` : ''}`;
}

function fill(w: WellRowView | undefined, colouring: MapColouring): string {
  if (!w) return QC_COLOUR.empty;
  if (colouring === 'qc')
    return w.excluded ? QC_COLOUR.excluded : w.qcReasons.length ? QC_COLOUR.fail : QC_COLOUR.pass;
  return w.fractionalBlock === null ? QC_COLOUR.empty : blockColour(w.fractionalBlock);
}

/**
 * The plate as a grid of wells, coloured by block or QC; arrow keys move, and where wells may be picked
 * (no `onToggle` on a locked plate) Enter, Space or a click selects.
 */
export function PlateMap({
  format,
  wells,
  colouring,
  selected,
  onToggle,
}: {
  format: number;
  wells: WellRowView[];
  colouring: MapColouring;
  selected: ReadonlySet<string>;
  onToggle?: ((wellId: string) => void) | undefined;
}) {
  const { rows, columns } = GEOMETRY[format] ?? GEOMETRY[96]!;
  const [focus, setFocus] = useState(0);
  const byCell = new Map(wells.map((w) => [w.rowIndex * columns + w.columnIndex, w]));
  const cell = format === 96 ? 30 : format === 384 ? 18 : 10;
  const margin = 22;
  const width = margin + columns * cell;
  const height = margin + rows * cell;
  const focused = byCell.get(focus);

  function onKey(event: KeyboardEvent<SVGSVGElement>) {
    const moves: Record<string, number> = {
      ArrowRight: 1,
      ArrowLeft: -1,
      ArrowDown: columns,
      ArrowUp: -columns,
    };
    if (event.key in moves) {
      event.preventDefault();
      setFocus((f) => Math.min(rows * columns - 1, Math.max(0, f + moves[event.key]!)));
    } else if ((event.key === 'Enter' || event.key === ' ') && focused && onToggle) {
      event.preventDefault();
      onToggle(focused.id);
    }
  }

  return (
    <figure className="space-y-2">
      <svg
        viewBox={`0 0 ${width} ${height}`}
        className="w-full max-w-3xl rounded-md bg-card outline-none focus-visible:ring-3 focus-visible:ring-lagoon-500"
        role="grid"
        aria-label={`Plate map, ${format} wells, coloured by ${colouring === 'qc' ? 'QC status' : 'fractional block'}`}
        tabIndex={0}
        onKeyDown={onKey}
        aria-activedescendant={focused ? `well-${focused.id}` : undefined}
      >
        {Array.from({ length: columns }, (_, c) => (
          <text
            key={`c${c}`}
            x={margin + c * cell + cell / 2}
            y={14}
            textAnchor="middle"
            fontSize={cell > 20 ? 10 : 7}
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
            fontSize={cell > 20 ? 10 : 7}
            fill="#51677d"
          >
            {rowLetter(r)}
          </text>
        ))}
        {Array.from({ length: rows * columns }, (_, i) => {
          const w = byCell.get(i);
          const x = margin + (i % columns) * cell;
          const y = margin + Math.floor(i / columns) * cell;
          const isSelected = w ? selected.has(w.id) : false;
          return (
            <g
              key={i}
              id={w ? `well-${w.id}` : undefined}
              role={w ? 'gridcell' : undefined}
              aria-selected={w && onToggle ? isSelected : undefined}
              aria-label={w ? describe(w) : undefined}
              onClick={() => {
                setFocus(i);
                if (w) onToggle?.(w.id);
              }}
              className={w && onToggle ? 'cursor-pointer' : undefined}
            >
              {w ? <title>{describe(w)}</title> : null}
              <rect
                x={x + 1}
                y={y + 1}
                width={cell - 2}
                height={cell - 2}
                rx={cell / 2.5}
                fill={fill(w, colouring)}
                stroke={isSelected ? '#0b1622' : i === focus ? '#168f94' : '#d3dbe3'}
                strokeWidth={isSelected || i === focus ? 2 : 1}
              />
              {w?.excluded ? (
                <line
                  x1={x + 3}
                  y1={y + cell - 3}
                  x2={x + cell - 3}
                  y2={y + 3}
                  stroke="#2b4157"
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
                  fill={colouring === 'block' && (w.fractionalBlock ?? 0) > 0.6 ? '#fff' : '#12202f'}
                >
                  {w.role === 'vehicle' ? 'V' : 'R'}
                </text>
              ) : null}
            </g>
          );
        })}
      </svg>
      <figcaption>
        <MapLegend colouring={colouring} />
      </figcaption>
    </figure>
  );
}

function MapLegend({ colouring }: { colouring: MapColouring }) {
  const swatch = (colour: string, label: string) => (
    <span key={label} className="inline-flex items-center gap-1.5">
      <span
        aria-hidden
        className="inline-block h-3 w-3 rounded-full border border-ink-300"
        style={{ background: colour }}
      />
      {label}
    </span>
  );
  return (
    <div className="flex flex-wrap items-center gap-4 text-xs text-ink-700">
      {colouring === 'qc'
        ? [
            swatch(QC_COLOUR.pass, 'QC passed'),
            swatch(QC_COLOUR.fail, 'QC failed'),
            swatch(QC_COLOUR.excluded, 'Excluded (struck through)'),
          ]
        : [
            swatch(blockColour(0), '0 % block'),
            swatch(blockColour(0.5), '50 %'),
            swatch(blockColour(1), '100 %'),
            swatch('#ffffff', 'No value'),
          ]}
      <span>V vehicle · R reference blocker</span>
    </div>
  );
}
