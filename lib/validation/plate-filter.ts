import { z } from 'zod';
import { PLATE_STATES } from '@/models/plate';

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD.');
const blankToUndefined = (value: unknown) => (value === '' ? undefined : value);

/** The plates list's filters as search parameters; anything unreadable is dropped, not an error page. */
export const plateFilterSchema = z.object({
  screen: z.preprocess(blankToUndefined, z.uuid().optional()).catch(undefined),
  state: z.preprocess(blankToUndefined, z.enum(PLATE_STATES).optional()).catch(undefined),
  importer: z.preprocess(blankToUndefined, z.uuid().optional()).catch(undefined),
  from: z.preprocess(blankToUndefined, day.optional()).catch(undefined),
  to: z.preprocess(blankToUndefined, day.optional()).catch(undefined),
});

export type PlateFilterParams = z.infer<typeof plateFilterSchema>;
