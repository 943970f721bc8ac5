import { z } from 'zod';
import { AppError } from '@/lib/errors';

const uuid = z.uuid();

/** A route's id parameter; anything that is not a UUID is answered as not found. */
export function parseId(value: unknown, what = 'record'): string {
  const parsed = uuid.safeParse(value);
  if (!parsed.success) throw new AppError('not_found', `No such ${what}.`);
  return parsed.data;
}
