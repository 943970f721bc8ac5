import type { ReactNode } from 'react';

/** Plot box: the SVG size and the margins around the drawing area. */
export interface PlotBox {
  width: number;
  height: number;
  top: number;
  right: number;
  bottom: number;
  left: number;
}

export const PLOT: PlotBox = { width: 360, height: 230, top: 12, right: 14, bottom: 40, left: 48 };

type Scale = ((value: number) => number) & { ticks?: (count?: number) => number[] };

const INK = '#2b4157';
const MUTED = '#51677d';
const GRID = '#e3e9ef';

/** Numbers on axes: short, no trailing zeros. */
export function tickText(value: number): string {
  if (value === 0) return '0';
  const abs = Math.abs(value);
  return abs >= 1e5 || abs < 0.001 ? value.toExponential(0) : Number(value.toPrecision(4)).toString();
}

/** The horizontal axis along the bottom, with its ticks and label. */
export function AxisBottom({
  box,
  scale,
  ticks,
  label,
  y,
}: {
  box: PlotBox;
  scale: Scale;
  ticks: number[];
  label: string;
  y?: number;
}) {
  const at = y ?? box.height - box.bottom;
  return (
    <g aria-hidden="true">
      <line x1={box.left} x2={box.width - box.right} y1={at} y2={at} stroke={MUTED} />
      {ticks.map((t) => (
        <g key={t}>
          <line x1={scale(t)} x2={scale(t)} y1={at} y2={at + 4} stroke={MUTED} />
          <text x={scale(t)} y={at + 15} textAnchor="middle" fontSize={10} fill={MUTED}>
            {tickText(t)}
          </text>
        </g>
      ))}
      <text
        x={(box.left + box.width - box.right) / 2}
        y={box.height - 6}
        textAnchor="middle"
        fontSize={10.5}
        fill={INK}
      >
        {label}
      </text>
    </g>
  );
}

/** The vertical axis on the left, with grid lines across the plot, ticks and label. */
export function AxisLeft({
  box,
  scale,
  ticks,
  label,
  top,
  bottom,
}: {
  box: PlotBox;
  scale: Scale;
  ticks: number[];
  label: string;
  top?: number;
  bottom?: number;
}) {
  const y0 = top ?? box.top;
  const y1 = bottom ?? box.height - box.bottom;
  return (
    <g aria-hidden="true">
      {ticks.map((t) => (
        <g key={t}>
          <line x1={box.left} x2={box.width - box.right} y1={scale(t)} y2={scale(t)} stroke={GRID} />
          <text x={box.left - 6} y={scale(t) + 3} textAnchor="end" fontSize={10} fill={MUTED}>
            {tickText(t)}
          </text>
        </g>
      ))}
      <text
        transform={`translate(13 ${(y0 + y1) / 2}) rotate(-90)`}
        textAnchor="middle"
        fontSize={10.5}
        fill={INK}
      >
        {label}
      </text>
    </g>
  );
}

/** A figure: the SVG with an accessible name, and a caption (legend) under it. */
export function PlotFigure({
  title,
  label,
  box = PLOT,
  legend,
  children,
}: {
  title: string;
  label: string;
  box?: PlotBox;
  legend?: ReactNode;
  children: ReactNode;
}) {
  return (
    <figure className="gw-card p-4">
      <figcaption className="mb-2 text-sm font-semibold text-ink-900">{title}</figcaption>
      <svg viewBox={`0 0 ${box.width} ${box.height}`} className="w-full" role="img" aria-label={label}>
        <title>{label}</title>
        {children}
      </svg>
      {legend ? (
        <div className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-700">{legend}</div>
      ) : null}
    </figure>
  );
}

/** One legend entry: a line sample in the series' colour and dash, and its name. */
export function LegendItem({ color, dash, children }: { color: string; dash?: string; children: ReactNode }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <svg width="22" height="8" aria-hidden="true">
        <line x1="1" x2="21" y1="4" y2="4" stroke={color} strokeWidth={2.5} strokeDasharray={dash} />
      </svg>
      {children}
    </span>
  );
}
