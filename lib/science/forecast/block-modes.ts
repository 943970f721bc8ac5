import type { ForecastResult } from './assemble';
import { computeForecast } from './forecast';
import { planForecast } from './plan';
import { parseForecastRequest, type ParsedForecastRequest } from './request-schema';

/** The same compound forecast twice: tonic block only, and with its state dependence. */
export interface BlockModesForecast {
  /** Every potency taken as tonic block at its ic50 (inactivatedIc50 ignored). */
  tonic: ForecastResult;
  /** Potencies with inactivatedIc50 block state-dependently (Bean, Cohen & Tsien 1983). */
  stateDependent: ForecastResult;
  /** Per condition (same order as the forecasts' conditions): ΔV½ (mV) of each state-dependent conductance. */
  inactivationShift_mV: Record<string, number>[];
}

/** The request with every inactivated-state IC50 dropped. */
export function tonicOnly(request: ParsedForecastRequest): ParsedForecastRequest {
  if (!request.potencies) return request;
  return {
    ...request,
    potencies: Object.fromEntries(
      Object.entries(request.potencies).map(([name, p]) => [name, { ic50: p.ic50, hill: p.hill }]),
    ),
  };
}

/**
 * Forecast a request with potencies both ways, side by side (computed in this thread), each with its own
 * uncertainty bands and firing transition when the request asks for bands. Without any inactivatedIc50
 * the two are one computation (the same result object). Throws ForecastRequestError on an invalid request.
 */
export function computeBlockModes(input: unknown): BlockModesForecast {
  const request = parseForecastRequest(input);
  const tonic = computeForecast(tonicOnly(request));
  const stateDependent = Object.values(request.potencies ?? {}).some((p) => p.inactivatedIc50 !== undefined)
    ? computeForecast(request)
    : tonic;
  return {
    tonic,
    stateDependent,
    inactivationShift_mV: planForecast(request).conditions.map((c) => c.inactivationShift),
  };
}
