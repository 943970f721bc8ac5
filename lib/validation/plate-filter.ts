import { z } from 'zod';
import { plateStateSchema } from '@/lib/domain/plate-states';

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD.');
const blankToUndefined = (value: unknown) => (value === '' ? undefined : value);

/** The plates list's filters as search parameters; anything unreadable is dropped, not an error page. */
export const plateFilterSchema = z.object({
  screen: z.preprocess(blankToUndefined, z.uuid().optional()).catch(undefined),
  state: z.preprocess(blankToUndefined, plateStateSchema.optional()).catch(undefined),
  importer: z.preprocess(blankToUndefined, z.uuid().optional()).catch(undefined),
  from: z.preprocess(blankToUndefined, day.optional()).catch(undefined),
  to: z.preprocess(blankToUndefined, day.optional()).catch(undefined),
});

export type PlateFilterParams = z.infer<typeof plateFilterSchema>;

/** The page of the plates list, from 1; anything unreadable is the first page. */
export const platePageSchema = z
  .preprocess(
    (value) => (Array.isArray(value) ? value[0] : value),
    z.coerce.number().int().min(1).max(1_000_000),
  )
  .catch(1);

/** The address of one page of the plates list, with the same filters (page 1 has no page parameter). */
export function platePageHref(filter: PlateFilterParams, page: number): string {
  const params = new URLSearchParams(
    Object.entries(filter).filter((entry): entry is [string, string] => Boolean(entry[1])),
  );
  if (page > 1) params.set('page', String(page));
  const query = params.toString();
  return query ? `/plates?${query}` : '/plates';
}

/** The address of one page of My work (the home page; page 1 has no page parameter). */
export function myWorkPageHref(page: number): string {
  return page > 1 ? `/?page=${page}` : '/';
}
