import 'server-only';
import type { ConditionForecast } from '@/lib/science/forecast/assemble';
import type { ConditionBand } from '@/lib/science/forecast/bands';
import type { ConditionView, ForecastView } from '@/lib/validation/forecasts';
import { isExposure } from './sweep';
import type { StoredForecast } from './store';

function conditionView(
  c: ConditionForecast,
  exposures_uM: number[],
  band: ConditionBand | null = null,
): ConditionView {
  const concentration_uM = c.concentration ?? 0;
  const { rest_mV, rheobase_uA_cm2, threshold_mV, referenceRate_Hz, fI, flags } = c.measures;
  return {
    concentration_uM,
    exposure: concentration_uM > 0 && isExposure(concentration_uM, exposures_uM),
    block: c.block,
    measures: { rest_mV, rheobase_uA_cm2, threshold_mV, referenceRate_Hz, fI, flags },
    shifts: c.shifts,
    band: band
      ? {
          block: band.block,
          rheobase_uA_cm2: band.rheobase_uA_cm2,
          threshold_mV: band.threshold_mV,
          referenceRate_Hz: band.referenceRate_Hz,
          nearTransition: band.nearTransition ?? false,
        }
      : null,
  };
}

/** What a page shows of a stored forecast: measures, shifts, f–I curves and traces (the detail stays stored). */
export function forecastView(stored: StoredForecast, exposures_uM: number[]): ForecastView {
  const r = stored.result;
  const traceIndex = r.traces?.conditionIndex ?? null;
  return {
    inputSha256: stored.inputSha256,
    computedAt: stored.computedAt,
    reused: stored.reused,
    preset: r.preset,
    protocol: {
      rheobaseStep_ms: r.protocol.rheobaseStep_ms,
      rateStep_ms: r.protocol.rateStep_ms,
      thresholdSlope_mV_ms: r.protocol.thresholdSlope_mV_ms,
      referenceDriveFactor: r.protocol.referenceDriveFactor,
    },
    referenceDrive_uA_cm2: r.referenceDrive_uA_cm2,
    control: conditionView(r.control, exposures_uM),
    conditions: r.conditions.map((c, i) => conditionView(c, exposures_uM, r.bands?.conditions[i] ?? null)),
    bands: r.bands
      ? {
          draws: r.bands.draws,
          seed: r.bands.seed,
          method: r.bands.method,
          sources: r.bands.sources,
          transition: r.bands.transition
            ? {
                status: r.bands.transition.status,
                concentration_uM: r.bands.transition.concentration,
                block: r.bands.transition.block,
                band: r.bands.transition.band,
                note: r.bands.transition.note,
              }
            : null,
        }
      : null,
    traces: r.traces
      ? {
          drive_uA_cm2: r.traces.drive_uA_cm2,
          concentration_uM: traceIndex === null ? null : (r.conditions[traceIndex]?.concentration ?? null),
          control: r.traces.control,
          condition: r.traces.condition,
        }
      : null,
    caution: r.caution,
  };
}
