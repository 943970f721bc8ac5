'use client';

import useSWR from 'swr';
import { schemaFetcher } from '@/components/plates/plate-data';
import { compoundForecastSchema, plateForecastListSchema } from '@/lib/validation/forecasts';

export const plateForecastListKey = (plateId: string) => `/api/plates/${plateId}/forecast`;
export const plateForecastKey = (plateId: string, compoundId: string, at: number) =>
  `/api/plates/${plateId}/forecast?compoundId=${compoundId}&at=${at}`;
export const compoundForecastKey = (compoundId: string, screenId: string, at: number) =>
  `/api/compounds/${compoundId}/forecast?screenId=${screenId}&at=${at}`;

export const fetchCompoundForecast = schemaFetcher(compoundForecastSchema);

/** The plate's compounds with their potencies and whether each forecast is stored (nothing computed). */
export function usePlateForecastList(plateId: string) {
  return useSWR(plateForecastListKey(plateId), schemaFetcher(plateForecastListSchema), {
    revalidateOnFocus: false,
  });
}

/** One compound's forecast on the plate; the server computes it on first request and stores it. */
export function usePlateForecast(plateId: string, compoundId: string | null, at: number | null) {
  return useSWR(
    compoundId && at !== null ? plateForecastKey(plateId, compoundId, at) : null,
    fetchCompoundForecast,
    { revalidateOnFocus: false, keepPreviousData: true },
  );
}

/** A compound's forecast at exposure from its profile potencies, on one screen's preset and exposures. */
export function useCompoundForecast(compoundId: string, screenId: string, at: number | null) {
  return useSWR(at !== null ? compoundForecastKey(compoundId, screenId, at) : null, fetchCompoundForecast, {
    revalidateOnFocus: false,
    keepPreviousData: true,
  });
}
