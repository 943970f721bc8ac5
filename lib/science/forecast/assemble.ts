import type { VoltageTrace } from '../neuron/downsample';
import type { Excitability, ExcitabilityFlag } from '../neuron/excitability';
import type { ForecastBands } from './bands';
import type { ForecastPlan, ForecastProtocol } from './plan';

/** A measurement beside control: delta = value − control, relative = delta / |control|. */
export interface Shift {
  control: number | null;
  value: number | null;
  delta: number | null;
  relative: number | null;
}

export interface ConditionMeasures {
  rest_mV: number | null;
  rheobase_uA_cm2: number | null;
  threshold_mV: number | null;
  referenceRate_Hz: number | null;
  /** Every measured rate keyed by its drive as text (e.g. "10"). */
  rates_Hz: Record<string, number>;
  /** The f–I curve: every measured drive, ascending. */
  fI: { drive_uA_cm2: number; rate_Hz: number }[];
  flags: ExcitabilityFlag[];
}

export interface ConditionForecast {
  label: string;
  concentration: number | null;
  block: Record<string, number>;
  conductances_mS_cm2: Record<string, number>;
  measures: ConditionMeasures;
  shifts: Record<'rest_mV' | 'rheobase_uA_cm2' | 'threshold_mV' | 'referenceRate_Hz', Shift>;
  detail: Excitability;
}

export interface ForecastResult {
  preset: { name: string; title: string; reference: string };
  protocol: ForecastProtocol;
  concentrationUnit: string | null;
  referenceDrive_uA_cm2: number | null;
  control: ConditionForecast;
  conditions: ConditionForecast[];
  traces: {
    drive_uA_cm2: number;
    control: VoltageTrace;
    condition: VoltageTrace | null;
    conditionIndex: number | null;
  } | null;
  /** Uncertainty bands per condition (same order as `conditions`), when the request asked for them. */
  bands: ForecastBands | null;
  caution: string;
}

/** Shown wherever forecasts are shown or exported (design: Cautions). */
export const FORECAST_CAUTION =
  'Model forecast for research decision support only; not a clinical or regulatory safety determination.';

function shift(control: number | null, value: number | null): Shift {
  const delta = control !== null && value !== null ? value - control : null;
  const relative = delta !== null && control !== null && control !== 0 ? delta / Math.abs(control) : null;
  return { control, value, delta, relative };
}

export function measuresOf(e: Excitability): ConditionMeasures {
  return {
    rest_mV: e.rest_mV,
    rheobase_uA_cm2: e.rheobase_uA_cm2,
    threshold_mV: e.threshold_mV,
    referenceRate_Hz: e.reference?.rate_Hz ?? null,
    rates_Hz: Object.fromEntries(e.fI.map((r) => [String(r.drive_uA_cm2), r.rate_Hz])),
    fI: e.fI.map((r) => ({ drive_uA_cm2: r.drive_uA_cm2, rate_Hz: r.rate_Hz })),
    flags: e.flags,
  };
}

/** Put control, conditions and traces together, each measurement beside control. */
export function assembleForecast(
  plan: ForecastPlan,
  control: Excitability,
  conditions: Excitability[],
  traces: { drive_uA_cm2: number; control: VoltageTrace; condition: VoltageTrace | null } | null,
  bands: ForecastBands | null = null,
): ForecastResult {
  const ctrl = measuresOf(control);
  const conductances = (scale: Record<string, number>) =>
    Object.fromEntries(plan.preset.conductances.map((c) => [c.name, c.g_mS_cm2 * (scale[c.name] ?? 1)]));
  const forecastOf = (
    label: string,
    concentration: number | null,
    block: Record<string, number>,
    scale: Record<string, number>,
    e: Excitability,
  ): ConditionForecast => {
    const m = measuresOf(e);
    return {
      label,
      concentration,
      block,
      conductances_mS_cm2: conductances(scale),
      measures: m,
      shifts: {
        rest_mV: shift(ctrl.rest_mV, m.rest_mV),
        rheobase_uA_cm2: shift(ctrl.rheobase_uA_cm2, m.rheobase_uA_cm2),
        threshold_mV: shift(ctrl.threshold_mV, m.threshold_mV),
        referenceRate_Hz: shift(ctrl.referenceRate_Hz, m.referenceRate_Hz),
      },
      detail: e,
    };
  };
  const zero = Object.fromEntries(
    plan.preset.conductances.filter((c) => c.blockable).map((c) => [c.name, 0]),
  );
  return {
    preset: { name: plan.preset.name, title: plan.preset.title, reference: plan.preset.reference },
    protocol: plan.protocol,
    concentrationUnit: plan.concentrationUnit,
    referenceDrive_uA_cm2: control.referenceDrive_uA_cm2,
    control: forecastOf('control', 0, zero, {}, control),
    conditions: plan.conditions.map((c, i) =>
      forecastOf(c.label, c.concentration, c.block, c.scale, conditions[i]!),
    ),
    traces: traces
      ? { ...traces, conditionIndex: traces.condition ? (plan.trace?.condition ?? null) : null }
      : null,
    bands,
    caution: FORECAST_CAUTION,
  };
}
