import { scaleLinear, scaleLog } from 'd3-scale';
import { area, line } from 'd3-shape';
import type { ConditionView } from '@/lib/validation/forecasts';
import { AxisBottom, AxisLeft, LegendItem, PLOT, PlotFigure } from './plot-axes';
import { CONTROL_COLOR, umText } from './series-colors';

const MEASURES = {
  rheobase: {
    title: 'Rheobase against concentration',
    axis: 'Rheobase (µA/cm²)',
    unit: 'µA/cm²',
    value: (c: ConditionView) => c.measures.rheobase_uA_cm2,
    band: (c: ConditionView) => c.band?.rheobase_uA_cm2 ?? null,
  },
  rate: {
    title: 'Firing rate at the reference drive against concentration',
    axis: 'Firing rate (Hz)',
    unit: 'Hz',
    value: (c: ConditionView) => c.measures.referenceRate_Hz,
    band: (c: ConditionView) => c.band?.referenceRate_Hz ?? null,
  },
} as const;

const LINE = '#0f7479';
const BAND_FILL = '#0f747933';

/**
 * One measure over the concentration sweep (log axis), control as a dashed line; exposures are the large
 * points. A condition without a value (no spike up to the search ceiling) is drawn as a cross at the top.
 * The shaded band is the 2.5–97.5 % range over the draws of the fits' uncertainty; where its upper end is
 * beyond the search ceiling it runs to the top of the plot.
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
  const bands = conditions.map((c) => m.band(c));
  const withBand = conditions.filter((c) => m.band(c)?.low != null);
  const known = [...values, ...bands.map((b) => b?.high ?? null), ...bands.map((b) => b?.low ?? null)].filter(
    (v): v is number => v !== null,
  );
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
  const top = y.domain()[1]!;
  const shaded = area<ConditionView>()
    .x((c) => x(c.concentration_uM))
    .y0((c) => y(m.band(c)!.low!))
    .y1((c) => y(m.band(c)!.high ?? top));
  const decades = x.ticks().filter((t) => Number.isInteger(Math.log10(t)));
  const text = (v: number | null) => (v === null ? 'no firing' : `${v.toPrecision(3)} ${m.unit}`);
  const bandText = (c: ConditionView) => {
    const b = m.band(c);
    return b && b.low !== null
      ? ` (95 % band ${b.low.toPrecision(3)} to ${b.high === null ? 'beyond the ceiling' : b.high.toPrecision(3)})`
      : '';
  };
  const label = `${m.title}. Control ${text(controlValue)}. ${conditions.map((c) => `${umText(c.concentration_uM)}: ${text(m.value(c))}${bandText(c)}`).join('; ')}.`;
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
          {withBand.length > 0 ? (
            <span className="inline-flex items-center gap-1.5">
              <span aria-hidden className="inline-block h-3 w-5" style={{ background: BAND_FILL }} />
              95 % band
            </span>
          ) : null}
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
      {withBand.length > 1 ? (
        <path data-testid="forecast-band" d={shaded(withBand) ?? ''} fill={BAND_FILL} stroke="none" />
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
