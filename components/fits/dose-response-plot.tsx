import type { ReactNode } from 'react';
import { scaleLinear, scaleLog } from 'd3-scale';
import { area, line } from 'd3-shape';
import { fitCurve } from '@/lib/science/fit/hill-band';
import type { FitView, WellRowView } from '@/lib/validation/plates';
import { splitCurve, testedRange, type CurvePoint } from './curve-parts';

const W = 420;
const BASE_H = 330;
const LEGEND_H = 62;
/** Legend rows a second (use-dependent) fit adds: its curve, beyond its range, its wells. */
const SECOND_LEGEND_H = 34;
const BASE_M = { top: 12, right: 14, bottom: 40 + LEGEND_H, left: 50 };
/** The use-dependent fit: its own colour, dash-dotted within its tested range, dotted beyond, square wells. */
const SECOND = '#9d2a6b';
const SECOND_DASH = '9 3 2 3';
const BAND = '#2a9d9f';
const CURVE = '#0b4f53';
const EXCLUDED = '#3b4a59';
const FAILED = '#c2410c';

/** The plot's legend, drawn inside the SVG so that a downloaded file carries it. */
function Legend({
  top,
  hasCurve,
  hasBand,
  extrapolated,
  excluded,
  failed,
  names,
}: {
  top: number;
  hasCurve: boolean;
  hasBand: boolean;
  extrapolated: boolean;
  excluded: boolean;
  failed: boolean;
  /** With a second fit: the name of each readout (tonic first). */
  names: { tonic: string; useDependent: string } | null;
}) {
  const items: { key: string; label: string; mark: ReactNode }[] = [
    ...(hasCurve
      ? [
          {
            key: 'within',
            label: names ? `${names.tonic}: fitted, tested range` : 'Fitted curve, tested range',
            mark: <line x1={0} x2={22} y1={0} y2={0} stroke={CURVE} strokeWidth={2.2} />,
          },
        ]
      : []),
    ...(extrapolated
      ? [
          {
            key: 'beyond',
            label: 'Beyond tested range',
            mark: (
              <line x1={0} x2={22} y1={0} y2={0} stroke={CURVE} strokeWidth={1.6} strokeDasharray="5 4" />
            ),
          },
        ]
      : []),
    ...(hasBand
      ? [
          {
            key: 'band',
            label: '95 % confidence band',
            mark: <rect x={0} y={-5} width={22} height={10} fill={BAND} fillOpacity={0.32} stroke={BAND} />,
          },
        ]
      : []),
    { key: 'used', label: 'Well used in the fit', mark: <circle cx={11} cy={0} r={3.5} fill="#12202f" /> },
    ...(names
      ? [
          {
            key: 'second-within',
            label: `${names.useDependent}: fitted, tested range`,
            mark: (
              <line
                x1={0}
                x2={22}
                y1={0}
                y2={0}
                stroke={SECOND}
                strokeWidth={2.2}
                strokeDasharray={SECOND_DASH}
              />
            ),
          },
          {
            key: 'second-beyond',
            label: `${names.useDependent}: beyond range`,
            mark: (
              <line x1={0} x2={22} y1={0} y2={0} stroke={SECOND} strokeWidth={1.4} strokeDasharray="2 3" />
            ),
          },
          {
            key: 'second-used',
            label: `${names.useDependent}: well (square)`,
            mark: <rect x={7.5} y={-3.5} width={7} height={7} fill={SECOND} />,
          },
        ]
      : []),
    ...(excluded
      ? [
          {
            key: 'excluded',
            label: 'Excluded well (hollow)',
            mark: <circle cx={11} cy={0} r={3.5} fill="#ffffff" stroke={EXCLUDED} strokeWidth={1.6} />,
          },
        ]
      : []),
    ...(failed
      ? [
          {
            key: 'failed',
            label: 'Failed QC (hollow)',
            mark: <circle cx={11} cy={0} r={3.5} fill="#ffffff" stroke={FAILED} strokeWidth={1.6} />,
          },
        ]
      : []),
  ];
  return (
    <g data-plot-legend="" aria-label="Legend">
      {items.map((item, i) => (
        <g
          key={item.key}
          transform={`translate(${BASE_M.left - 30 + (i % 2) * 190} ${top + Math.floor(i / 2) * 17})`}
        >
          {item.mark}
          <text x={28} y={3.5} fontSize={10.5} fill="#2b4157">
            {item.label}
          </text>
        </g>
      ))}
    </g>
  );
}

/**
 * Concentration–block plot of one fit: wells as points (excluded and QC-failed ones hollow), the fitted
 * curve solid across the tested concentrations and dashed beyond them, its 95 % band, the IC50 marker and
 * a legend inside the drawing. Log concentration axis in µM, block in %.
 */
export function DoseResponsePlot({
  fit: view,
  points,
  id,
  useDependent: second,
}: {
  fit: FitView;
  points: WellRowView[];
  id?: string;
  /** The use-dependent fit of the same compound and target with its wells, drawn with the tonic one. */
  useDependent?: { fit: FitView; points: WellRowView[] } | undefined;
}) {
  // The curves and bands are worked out here from the fits' estimates (the fits answer carries no points).
  const fit = { ...view, curve: fitCurve(view.model, view.curveBasis) };
  const useDependent = second
    ? { ...second, fit: { ...second.fit, curve: fitCurve(second.fit.model, second.fit.curveBasis) } }
    : undefined;
  const extra = useDependent ? SECOND_LEGEND_H : 0;
  const H = BASE_H + extra;
  const M = { ...BASE_M, bottom: BASE_M.bottom + extra };
  const curves = [fit.curve, ...(useDependent ? [useDependent.fit.curve] : [])].filter((c) => c.length > 0);
  const concentrations = [...points, ...(useDependent?.points ?? [])]
    .map((p) => p.concentration_uM!)
    .filter((c) => c > 0);
  const lo = Math.min(...concentrations, ...curves.map((c) => c[0]!.concentration_uM));
  const hi = Math.max(...concentrations, ...curves.map((c) => c.at(-1)!.concentration_uM));
  const x = scaleLog()
    .domain([lo, hi])
    .range([M.left, W - M.right])
    .nice();
  const y = scaleLinear()
    .domain([-0.2, 1.2])
    .range([H - M.bottom, M.top]);
  const curve = line<CurvePoint>()
    .x((d) => x(d.concentration_uM))
    .y((d) => y(d.block));
  const band = area<CurvePoint>()
    .x((d) => x(d.concentration_uM))
    .y0((d) => y(d.low ?? d.block))
    .y1((d) => y(d.high ?? d.block));
  const ticks = x.ticks().filter((t) => Number.isInteger(Math.log10(t)));
  const range = testedRange(points);
  const parts = range ? splitCurve(fit.curve, range.lo_uM, range.hi_uM) : null;
  const hasBand = fit.curve.length > 0 && fit.curve[0]!.low !== null;
  const drawn = points.filter(
    (p) => p.concentration_uM && p.concentration_uM > 0 && p.fractionalBlock !== null,
  );
  const names = useDependent
    ? {
        tonic: fit.readoutName ?? 'tonic',
        useDependent: useDependent.fit.readoutName ?? 'use-dependent',
      }
    : null;
  const secondRange = useDependent ? testedRange(useDependent.points) : null;
  const secondParts =
    useDependent && secondRange
      ? splitCurve(useDependent.fit.curve, secondRange.lo_uM, secondRange.hi_uM)
      : null;
  const secondDrawn = (useDependent?.points ?? []).filter(
    (p) => p.concentration_uM && p.concentration_uM > 0 && p.fractionalBlock !== null,
  );
  const label = names
    ? `${fit.compound} on ${fit.target}, ${names.tonic} and ${names.useDependent}: ${fit.message} ${useDependent!.fit.message}`
    : `${fit.compound} on ${fit.target}: ${fit.message}`;
  return (
    <svg
      id={id}
      viewBox={`0 0 ${W} ${H}`}
      className="w-full"
      role="img"
      aria-label={label}
      fontFamily="system-ui, sans-serif"
    >
      <title>{label}</title>
      <rect x={0} y={0} width={W} height={H} fill="#ffffff" />
      {[0, 0.5, 1].map((v) => (
        <g key={v}>
          <line
            x1={M.left}
            x2={W - M.right}
            y1={y(v)}
            y2={y(v)}
            stroke="#e3e9ef"
            strokeDasharray={v === 0.5 ? '3 3' : undefined}
          />
          <text x={M.left - 6} y={y(v) + 3} textAnchor="end" fontSize={10} fill="#51677d">
            {v * 100}
          </text>
        </g>
      ))}
      <line x1={M.left} x2={W - M.right} y1={H - M.bottom} y2={H - M.bottom} stroke="#9aa9b8" />
      {ticks.map((t) => (
        <g key={t}>
          <line x1={x(t)} x2={x(t)} y1={H - M.bottom} y2={H - M.bottom + 4} stroke="#9aa9b8" />
          <text x={x(t)} y={H - M.bottom + 15} textAnchor="middle" fontSize={10} fill="#51677d">
            {t >= 1 ? t : t.toPrecision(1)}
          </text>
        </g>
      ))}
      <text
        x={(M.left + W - M.right) / 2}
        y={H - M.bottom + 31}
        textAnchor="middle"
        fontSize={10.5}
        fill="#2b4157"
      >
        Concentration (µM, log scale)
      </text>
      <text
        transform={`translate(13 ${(M.top + H - M.bottom) / 2}) rotate(-90)`}
        textAnchor="middle"
        fontSize={10.5}
        fill="#2b4157"
      >
        Fractional block (%)
      </text>
      {hasBand ? (
        <path
          d={band(fit.curve) ?? ''}
          fill={BAND}
          fillOpacity={0.32}
          stroke={BAND}
          strokeOpacity={0.8}
          strokeWidth={0.8}
          data-part="band"
        />
      ) : null}
      {parts ? (
        <>
          {(['below', 'above'] as const).map((key) =>
            parts[key].length ? (
              <path
                key={key}
                d={curve(parts[key]) ?? ''}
                fill="none"
                stroke={CURVE}
                strokeWidth={1.6}
                strokeDasharray="5 4"
                data-part={key}
              />
            ) : null,
          )}
          {parts.within.length ? (
            <path
              d={curve(parts.within) ?? ''}
              fill="none"
              stroke={CURVE}
              strokeWidth={2.2}
              data-part="within"
            />
          ) : null}
        </>
      ) : null}
      {fit.ic50_uM !== null && fit.ic50_uM >= x.domain()[0]! && fit.ic50_uM <= x.domain()[1]! ? (
        <g>
          <line
            x1={x(fit.ic50_uM)}
            x2={x(fit.ic50_uM)}
            y1={y(0.5)}
            y2={H - M.bottom}
            stroke="#9a5b00"
            strokeDasharray="4 2"
          />
          <text x={x(fit.ic50_uM) + 4} y={H - M.bottom - 4} fontSize={10} fill="#9a5b00">
            IC50
          </text>
        </g>
      ) : null}
      {secondParts ? (
        <g data-readout="use_dependent">
          {(['below', 'above'] as const).map((key) =>
            secondParts[key].length ? (
              <path
                key={key}
                d={curve(secondParts[key]) ?? ''}
                fill="none"
                stroke={SECOND}
                strokeWidth={1.4}
                strokeDasharray="2 3"
                data-part={`use-dependent-${key}`}
              />
            ) : null,
          )}
          {secondParts.within.length ? (
            <path
              d={curve(secondParts.within) ?? ''}
              fill="none"
              stroke={SECOND}
              strokeWidth={2.2}
              strokeDasharray={SECOND_DASH}
              data-part="use-dependent-within"
            />
          ) : null}
        </g>
      ) : null}
      {secondDrawn.map((p) => {
        const used = !p.excluded && p.qcReasons.length === 0;
        return (
          <rect
            key={p.readoutId}
            x={x(p.concentration_uM!) - 3.5}
            y={y(Math.max(-0.2, Math.min(1.2, p.fractionalBlock!))) - 3.5}
            width={7}
            height={7}
            fill={used ? SECOND : '#ffffff'}
            stroke={SECOND}
            strokeWidth={used ? 1 : 1.6}
            data-well={used ? 'use-dependent' : 'use-dependent-left-out'}
          >
            <title>{`${p.position}, ${names!.useDependent}: ${(p.fractionalBlock! * 100).toFixed(1)} % at ${p.concentration_uM!.toPrecision(3)} µM${used ? '' : ' (left out)'}`}</title>
          </rect>
        );
      })}
      {drawn.map((p) => {
        const kind = p.excluded ? 'excluded' : p.qcReasons.length ? 'failed' : 'used';
        return (
          <circle
            key={p.readoutId}
            cx={x(p.concentration_uM!)}
            cy={y(Math.max(-0.2, Math.min(1.2, p.fractionalBlock!)))}
            r={3.5}
            fill={kind === 'used' ? '#12202f' : '#ffffff'}
            stroke={kind === 'used' ? '#12202f' : kind === 'excluded' ? EXCLUDED : FAILED}
            strokeWidth={kind === 'used' ? 1 : 1.6}
            data-well={kind}
          >
            <title>{`${p.position}: ${(p.fractionalBlock! * 100).toFixed(1)} % at ${p.concentration_uM!.toPrecision(3)} µM${kind === 'used' ? '' : kind === 'excluded' ? ' (excluded)' : ' (failed QC)'}`}</title>
          </circle>
        );
      })}
      <Legend
        top={H - LEGEND_H - extra + 8}
        names={names}
        hasCurve={Boolean(parts?.within.length)}
        hasBand={hasBand}
        extrapolated={Boolean(parts?.below.length || parts?.above.length)}
        excluded={drawn.some((p) => p.excluded)}
        failed={drawn.some((p) => !p.excluded && p.qcReasons.length > 0)}
      />
    </svg>
  );
}
