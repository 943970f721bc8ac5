import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import type { ConditionView } from '@/lib/validation/forecasts';
import { AxisBottom, AxisLeft, LegendItem, PLOT, PlotFigure } from './plot-axes';
import { CONTROL_COLOR, exposureColors, umText } from './series-colors';

type Point = ConditionView['measures']['fI'][number];

/** Firing rate against step current for control and every exposure; the chosen exposure drawn heavier. */
export function FiPlot({
  control,
  exposures,
  chosen_uM,
}: {
  control: ConditionView;
  exposures: ConditionView[];
  chosen_uM: number | null;
}) {
  const colors = exposureColors(exposures.length);
  const series = [
    {
      name: 'Control',
      points: control.measures.fI,
      color: CONTROL_COLOR,
      dash: undefined as string | undefined,
      heavy: true,
    },
    ...exposures.map((c, i) => ({
      name: umText(c.concentration_uM),
      points: c.measures.fI,
      color: colors[i]!,
      dash: i % 2 ? '5 3' : undefined,
      heavy: c.concentration_uM === chosen_uM,
    })),
  ];
  const drives = series.flatMap((s) => s.points.map((p) => p.drive_uA_cm2));
  const rates = series.flatMap((s) => s.points.map((p) => p.rate_Hz));
  const x = scaleLinear()
    .domain([0, Math.max(1, ...drives)])
    .nice()
    .range([PLOT.left, PLOT.width - PLOT.right]);
  const y = scaleLinear()
    .domain([0, Math.max(10, ...rates)])
    .nice()
    .range([PLOT.height - PLOT.bottom, PLOT.top]);
  const path = line<Point>()
    .x((p) => x(p.drive_uA_cm2))
    .y((p) => y(p.rate_Hz));
  const label = `f–I curves. ${series.map((s) => `${s.name}: ${s.points.map((p) => `${p.rate_Hz.toFixed(0)} Hz at ${p.drive_uA_cm2.toPrecision(3)}`).join(', ')}`).join('. ')}.`;
  return (
    <PlotFigure
      title="f–I curves (firing rate against step current)"
      label={label}
      legend={series.map((s) => (
        <LegendItem key={s.name} color={s.color} dash={s.dash}>
          {s.name}
        </LegendItem>
      ))}
    >
      <AxisLeft box={PLOT} scale={y} ticks={y.ticks(5)} label="Firing rate (Hz)" />
      <AxisBottom box={PLOT} scale={x} ticks={x.ticks(6)} label="Step current (µA/cm²)" />
      {series.map((s) => (
        <g key={s.name}>
          <path
            d={path(s.points) ?? ''}
            fill="none"
            stroke={s.color}
            strokeWidth={s.heavy ? 2.4 : 1.3}
            strokeDasharray={s.dash}
          />
          {s.points.map((p) => (
            <circle
              key={p.drive_uA_cm2}
              cx={x(p.drive_uA_cm2)}
              cy={y(p.rate_Hz)}
              r={s.heavy ? 2.6 : 1.8}
              fill={s.color}
            />
          ))}
        </g>
      ))}
    </PlotFigure>
  );
}
