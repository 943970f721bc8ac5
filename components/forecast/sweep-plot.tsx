import { scaleLinear, scaleLog } from 'd3-scale';
import { line } from 'd3-shape';
import type { ConditionView } from '@/lib/validation/forecasts';
import { AxisBottom, AxisLeft, LegendItem, PLOT, PlotFigure } from './plot-axes';
import { CONTROL_COLOR, umText } from './series-colors';

const MEASURES = {
  rheobase: {
    title: 'Rheobase against concentration',
    axis: 'Rheobase (µA/cm²)',
    unit: 'µA/cm²',
    value: (c: ConditionView) => c.measures.rheobase_uA_cm2,
  },
  rate: {
    title: 'Firing rate at the reference drive against concentration',
    axis: 'Firing rate (Hz)',
    unit: 'Hz',
    value: (c: ConditionView) => c.measures.referenceRate_Hz,
  },
} as const;

const LINE = '#0f7479';

/**
 * One measure over the concentration sweep (log axis), control as a dashed line; exposures are the large
 * points. A condition without a value (no spike up to the search ceiling) is drawn as a cross at the top.
 */
export function SweepPlot({
  measure,
  control,
  conditions,
}: {
  measure: keyof typeof MEASURES;
  control: ConditionView;
  conditions: ConditionView[];
}) {
  const m = MEASURES[measure];
  const values = conditions.map((c) => m.value(c));
  const known = values.filter((v): v is number => v !== null);
  const controlValue = m.value(control);
  const concentrations = conditions.map((c) => c.concentration_uM);
  const x = scaleLog()
    .domain([Math.min(...concentrations), Math.max(...concentrations)])
    .range([PLOT.left, PLOT.width - PLOT.right])
    .nice();
  const y = scaleLinear()
    .domain([0, Math.max(1, controlValue ?? 0, ...known) * 1.08])
    .nice()
    .range([PLOT.height - PLOT.bottom, PLOT.top]);
  const path = line<ConditionView>()
    .defined((c) => m.value(c) !== null)
    .x((c) => x(c.concentration_uM))
    .y((c) => y(m.value(c)!));
  const decades = x.ticks().filter((t) => Number.isInteger(Math.log10(t)));
  const text = (v: number | null) => (v === null ? 'no firing' : `${v.toPrecision(3)} ${m.unit}`);
  const label = `${m.title}. Control ${text(controlValue)}. ${conditions.map((c) => `${umText(c.concentration_uM)}: ${text(m.value(c))}`).join('; ')}.`;
  return (
    <PlotFigure
      title={m.title}
      label={label}
      legend={
        <>
          <LegendItem color={CONTROL_COLOR} dash="4 3">
            Control
          </LegendItem>
          <LegendItem color={LINE}>Compound (large points: exposures)</LegendItem>
          {values.some((v) => v === null) ? <span>× no spike up to the search ceiling</span> : null}
        </>
      }
    >
      <AxisLeft box={PLOT} scale={y} ticks={y.ticks(5)} label={m.axis} />
      <AxisBottom box={PLOT} scale={x} ticks={decades} label="Concentration (µM, log scale)" />
      {controlValue !== null ? (
        <line
          x1={PLOT.left}
          x2={PLOT.width - PLOT.right}
          y1={y(controlValue)}
          y2={y(controlValue)}
          stroke={CONTROL_COLOR}
          strokeDasharray="4 3"
        />
      ) : null}
      <path d={path(conditions) ?? ''} fill="none" stroke={LINE} strokeWidth={2} />
      {conditions.map((c) => {
        const v = m.value(c);
        const cx = x(c.concentration_uM);
        if (v === null) {
          return (
            <text
              key={c.concentration_uM}
              x={cx}
              y={PLOT.top + 8}
              textAnchor="middle"
              fontSize={12}
              fill="#b42318"
            >
              ×
            </text>
          );
        }
        return (
          <circle
            key={c.concentration_uM}
            cx={cx}
            cy={y(v)}
            r={c.exposure ? 4.5 : 2.5}
            fill={c.exposure ? LINE : 'white'}
            stroke={LINE}
            strokeWidth={1.5}
          />
        );
      })}
    </PlotFigure>
  );
}
