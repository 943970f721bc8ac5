import { z, type ZodType } from 'zod';
import { AppError } from '@/lib/errors';

/** Parses a service's input; failures become an AppError whose details carry messages keyed by field. */
export function parseOrRefuse<Schema extends ZodType>(
  schema: Schema,
  raw: unknown,
  message = 'Some fields need attention.',
): z.output<Schema> {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    throw new AppError('invalid', message, { fieldErrors: z.flattenError(parsed.error).fieldErrors });
  }
  return parsed.data;
}
