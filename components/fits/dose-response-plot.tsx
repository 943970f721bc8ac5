import { scaleLinear, scaleLog } from 'd3-scale';
import { area, line } from 'd3-shape';
import type { FitView, WellRowView } from '@/lib/validation/plates';

const W = 360;
const H = 230;
const M = { top: 12, right: 14, bottom: 40, left: 46 };

/**
 * Concentration–block plot of one fit: wells as points (excluded or QC-failed hollow), the fitted
 * curve with its 95 % band, and the IC50 marker. Log concentration axis.
 */
export function DoseResponsePlot({ fit, points }: { fit: FitView; points: WellRowView[] }) {
  const concentrations = points.map((p) => p.concentration_uM!).filter((c) => c > 0);
  const lo = Math.min(...concentrations, ...(fit.curve.length ? [fit.curve[0]!.concentration_uM] : []));
  const hi = Math.max(...concentrations, ...(fit.curve.length ? [fit.curve.at(-1)!.concentration_uM] : []));
  const x = scaleLog()
    .domain([lo, hi])
    .range([M.left, W - M.right])
    .nice();
  const y = scaleLinear()
    .domain([-0.2, 1.2])
    .range([H - M.bottom, M.top]);
  const curve = line<FitView['curve'][number]>()
    .x((d) => x(d.concentration_uM))
    .y((d) => y(d.block));
  const band = area<FitView['curve'][number]>()
    .x((d) => x(d.concentration_uM))
    .y0((d) => y(d.low ?? d.block))
    .y1((d) => y(d.high ?? d.block));
  const ticks = x.ticks().filter((t) => Number.isInteger(Math.log10(t)));
  const label = `${fit.compound} on ${fit.target}: ${fit.message}`;
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="w-full" role="img" aria-label={label}>
      <title>{label}</title>
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
            {v * 100}%
          </text>
        </g>
      ))}
      {ticks.map((t) => (
        <text key={t} x={x(t)} y={H - M.bottom + 14} textAnchor="middle" fontSize={10} fill="#51677d">
          {t >= 1 ? t : t.toPrecision(1)}
        </text>
      ))}
      <text x={(M.left + W - M.right) / 2} y={H - 6} textAnchor="middle" fontSize={10} fill="#2b4157">
        Concentration (µM, log scale)
      </text>
      <text
        transform={`translate(12 ${(M.top + H - M.bottom) / 2}) rotate(-90)`}
        textAnchor="middle"
        fontSize={10}
        fill="#2b4157"
      >
        Fractional block
      </text>
      {fit.curve.length && fit.curve[0]!.low !== null ? (
        <path d={band(fit.curve) ?? ''} fill="#168f94" opacity={0.18} />
      ) : null}
      {fit.curve.length ? (
        <path d={curve(fit.curve) ?? ''} fill="none" stroke="#0b5f63" strokeWidth={2} />
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
      {points
        .filter((p) => p.concentration_uM && p.concentration_uM > 0 && p.fractionalBlock !== null)
        .map((p) => {
          const used = !p.excluded && p.qcReasons.length === 0;
          return (
            <circle
              key={p.readoutId}
              cx={x(p.concentration_uM!)}
              cy={y(Math.max(-0.2, Math.min(1.2, p.fractionalBlock!)))}
              r={3.5}
              fill={used ? '#12202f' : 'white'}
              stroke={used ? '#12202f' : '#b42318'}
              strokeWidth={1.4}
            >
              <title>{`${p.position}: ${(p.fractionalBlock! * 100).toFixed(1)} % at ${p.concentration_uM!.toPrecision(3)} µM${used ? '' : p.excluded ? ' (excluded)' : ' (failed QC)'}`}</title>
            </circle>
          );
        })}
    </svg>
  );
}
