'use client';

import useSWR from 'swr';
import type { z } from 'zod';
import { fitsResponseSchema, wellsResponseSchema } from '@/lib/validation/plates';

/** Fetches JSON from our API and checks it with the same zod schema the server answers with. */
export function schemaFetcher<T>(schema: z.ZodType<T>) {
  return async (url: string): Promise<T> => {
    const response = await fetch(url, { headers: { accept: 'application/json' } });
    const json: unknown = await response.json().catch(() => null);
    if (!response.ok)
      throw new Error(
        (json as { message?: string } | null)?.message ?? `The server answered ${response.status}.`,
      );
    return schema.parse(json);
  };
}

export const wellsKey = (plateId: string) => `/api/plates/${plateId}/wells`;
export const fitsKey = (plateId: string) => `/api/plates/${plateId}/fits`;

/**
 * The plate's wells; `initial`, when the page rendered them on the server, is shown at once and not
 * fetched again on mount (a change made here fetches them again through `mutate(wellsKey(…))`).
 */
export function usePlateWells(plateId: string, initial?: z.infer<typeof wellsResponseSchema>) {
  return useSWR(wellsKey(plateId), schemaFetcher(wellsResponseSchema), {
    revalidateOnFocus: false,
    ...(initial ? { fallbackData: initial, revalidateOnMount: false } : {}),
  });
}

export function usePlateFits(plateId: string) {
  return useSWR(fitsKey(plateId), schemaFetcher(fitsResponseSchema), { revalidateOnFocus: false });
}

/** Posts JSON to one of our API routes and returns its answer, or throws with the server's message. */
export async function postJson<T>(url: string, body: unknown): Promise<T> {
  const response = await fetch(url, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
  const json = (await response.json().catch(() => ({}))) as T & {
    message?: string;
    fields?: Record<string, string[]>;
  };
  if (!response.ok)
    throw new Error(
      [json.message, ...Object.values(json.fields ?? {}).flat()].filter(Boolean).join(' ') ||
        `The server answered ${response.status}.`,
    );
  return json;
}
