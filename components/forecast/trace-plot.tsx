import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import type { ForecastView } from '@/lib/validation/forecasts';
import { AxisBottom, AxisLeft, LegendItem, PlotFigure, type PlotBox } from './plot-axes';
import { CONTROL_COLOR, umText } from './series-colors';

const BOX: PlotBox = { width: 640, height: 330, top: 22, right: 16, bottom: 42, left: 52 };
const GAP = 30;

type Traces = NonNullable<ForecastView['traces']>;
type Trace = Traces['control'];

/**
 * Membrane voltage under the same current step for control (above) and the compound at the chosen
 * exposure (below), on one time axis and one voltage scale.
 */
export function TracePlot({ traces, compound, color }: { traces: Traces; compound: string; color: string }) {
  const panels: { name: string; trace: Trace; color: string }[] = [
    { name: 'Control', trace: traces.control, color: CONTROL_COLOR },
  ];
  const at = traces.concentration_uM === null ? '' : ` at ${umText(traces.concentration_uM)}`;
  if (traces.condition) panels.push({ name: `${compound}${at}`, trace: traces.condition, color });
  const all = panels.flatMap((p) => p.trace.v_mV);
  const tEnd = Math.max(...panels.map((p) => p.trace.t_ms.at(-1) ?? 0));
  const x = scaleLinear()
    .domain([0, tEnd])
    .range([BOX.left, BOX.width - BOX.right]);
  const plotHeight = (BOX.height - BOX.top - BOX.bottom - GAP * (panels.length - 1)) / panels.length;
  const drive = Number(traces.drive_uA_cm2.toPrecision(3));
  const label = `Voltage traces at a ${drive} µA/cm² step: ${panels.map((p) => `${p.name}, ${spikes(p.trace)} spikes`).join('; ')}.`;
  return (
    <PlotFigure
      title={`Voltage traces at the reference drive (${drive} µA/cm² step)`}
      label={label}
      box={BOX}
      legend={panels.map((p) => (
        <LegendItem key={p.name} color={p.color}>
          {p.name}
        </LegendItem>
      ))}
    >
      {panels.map((p, i) => {
        const top = BOX.top + i * (plotHeight + GAP);
        const y = scaleLinear()
          .domain([Math.min(-90, ...all), Math.max(50, ...all)])
          .nice()
          .range([top + plotHeight, top]);
        const path = line<number>()
          .x((_, k) => x(p.trace.t_ms[k]!))
          .y((v) => y(v));
        return (
          <g key={p.name}>
            <AxisLeft box={BOX} scale={y} ticks={y.ticks(3)} label="mV" top={top} bottom={top + plotHeight} />
            <text x={BOX.left} y={top - 8} fontSize={11} fontWeight={600} fill={p.color}>
              {p.name}
            </text>
            <path d={path(p.trace.v_mV) ?? ''} fill="none" stroke={p.color} strokeWidth={1.2} />
          </g>
        );
      })}
      <AxisBottom box={BOX} scale={x} ticks={x.ticks(6)} label="Time from step onset (ms)" />
    </PlotFigure>
  );
}

/** Upward crossings of 0 mV (the forecast's spike definition), for the plot's text description. */
function spikes(trace: Trace): number {
  let count = 0;
  for (let i = 1; i < trace.v_mV.length; i++) if (trace.v_mV[i - 1]! < 0 && trace.v_mV[i]! >= 0) count++;
  return count;
}
