import 'server-only';
import { AppError } from '@/lib/errors';
import type { ForecastRequest } from '@/lib/science/forecast/request-schema';
import type { PotencyUncertaintyInput } from '@/lib/science/forecast/uncertainty';
import type { TargetPotency } from '@/lib/validation/forecasts';
import { isExposure, sweepConcentrations } from './sweep';

/** Part of every stored input: a change to how Gatewell builds or computes forecasts changes the key. */
export const FORECAST_ENGINE = 'gatewell-forecast/3'; // 2: the 'firing-stops' flag; 3: uncertainty bands

/** Draws behind each forecast's bands, and their seed (fixed, so that a forecast's bands are reproducible). */
export const FORECAST_BAND_DRAWS = 200;
export const FORECAST_BAND_SEED = 20_261_210;

/** The f–I curve: 12 drives up to 3 × the control rheobase (our choice, no source). */
export const FORECAST_FI_CURVE = { points: 12, upToFactor: 3 } as const;

/** Points per voltage trace: enough for a plot about 1000 px wide, spike peaks kept. */
export const TRACE_POINTS = 1200;

export interface PlannedForecast {
  /** Tonic block only: every potency at its (tonic) IC50. */
  request: ForecastRequest;
  /**
   * The same request with state-dependent block where a used potency has a use-dependent IC50 (Ki, the
   * tonic IC50 then Kr; modulated receptor), or null when none has.
   */
  stateRequest: ForecastRequest | null;
  concentrations_uM: number[];
  traceConcentration_uM: number;
}

/**
 * The forecast request for a compound: its used potencies (conductance → IC50 µM and Hill slope) at the
 * exposures (ascending) and the concentration sweep, with traces at exposure `at` (default the highest),
 * and uncertainty bands from each used fit's covariance or wells (`uncertainty`, by conductance).
 * Returns the reason instead when there is nothing to forecast.
 */
export function planCompoundForecast(
  preset: string,
  potencies: TargetPotency[],
  exposures_uM: number[],
  at?: number,
  uncertainty?: Record<string, PotencyUncertaintyInput>,
): PlannedForecast | { reason: string } {
  if (at !== undefined && at >= exposures_uM.length) {
    throw new AppError(
      'invalid',
      `at must be the index of one of the screen’s ${exposures_uM.length} exposures (0–${Math.max(0, exposures_uM.length - 1)}).`,
    );
  }
  if (exposures_uM.length === 0)
    return {
      reason:
        'The screen has no exposures of interest. An admin adds them on the screen’s page; the forecast runs at those concentrations.',
    };
  const used = potencies.filter((p) => p.use === 'used');
  if (used.length === 0)
    return {
      reason:
        'No target gives a usable IC50 here, so every exposure would equal control. Nothing to forecast.',
    };
  const concentrations_uM = sweepConcentrations(
    exposures_uM,
    used.map((p) => p.ic50_uM!),
  );
  const traceConcentration_uM = exposures_uM[at ?? exposures_uM.length - 1]!;
  const condition = concentrations_uM.findIndex((c) => isExposure(c, [traceConcentration_uM]));
  const request: ForecastRequest = {
    preset: preset as ForecastRequest['preset'],
    potencies: Object.fromEntries(used.map((p) => [p.conductance, { ic50: p.ic50_uM!, hill: p.hill! }])),
    concentrations: concentrations_uM,
    concentrationUnit: 'µM',
    protocol: { fiCurve: { ...FORECAST_FI_CURVE } },
    trace: { condition, points: TRACE_POINTS },
    uncertainty: {
      seed: FORECAST_BAND_SEED,
      draws: FORECAST_BAND_DRAWS,
      // Bands at the exposures of interest only: 200 model runs per banded concentration, and the sweep's
      // other points would multiply that several times over.
      concentrations: exposures_uM.filter((c) => c > 0),
      potencies: Object.fromEntries(
        used.flatMap((p) =>
          uncertainty?.[p.conductance] ? [[p.conductance, uncertainty[p.conductance]!]] : [],
        ),
      ),
    },
  };
  // The same concentrations, bands and traces: only the Na inactivation shift of the potencies with Ki differs.
  const withKi = used.filter((p) => p.stateDependence?.inactivatedIc50_uM != null);
  const stateRequest: ForecastRequest | null = withKi.length
    ? {
        ...request,
        potencies: Object.fromEntries(
          used.map((p) => [
            p.conductance,
            p.stateDependence?.inactivatedIc50_uM != null
              ? { ic50: p.ic50_uM!, hill: p.hill!, inactivatedIc50: p.stateDependence.inactivatedIc50_uM }
              : { ic50: p.ic50_uM!, hill: p.hill! },
          ]),
        ),
      }
    : null;
  return { request, stateRequest, concentrations_uM, traceConcentration_uM };
}
