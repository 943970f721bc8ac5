import { z } from 'zod';

/** Rows per page of the audit trail. */
export const AUDIT_PAGE_SIZE = 100;

const MOMENT = /^(\d{4}-\d{2}-\d{2})(?:T(\d{2}:\d{2})(:\d{2}(?:\.\d{1,3})?)?)?(Z|[+-]\d{2}:\d{2})?$/;

/**
 * A moment typed into a filter: a date, or a date and time (as a datetime-local field sends it), read as
 * UTC unless it names its zone. As the end of a range it stands for the whole day, minute or second it
 * names, so the bound returned is exclusive.
 */
export function parseMoment(text: string, asEnd: boolean): Date | null {
  const match = MOMENT.exec(text);
  if (!match) return null;
  const [, day, minute, seconds, zone] = match;
  const start = new Date(`${day}T${minute ?? '00:00'}${seconds ?? ''}${zone ?? 'Z'}`);
  if (Number.isNaN(start.getTime())) return null;
  if (!zone && start.toISOString().slice(0, 10) !== day) return null; // 2026-02-30 rolls over: refuse it
  if (!asEnd) return start;
  const stepMs = !minute ? 86_400_000 : !seconds ? 60_000 : seconds.includes('.') ? 1 : 1000;
  return new Date(start.getTime() + stepMs);
}

const single = (value: unknown) => (Array.isArray(value) ? value[0] : value);
const blankToUndefined = (value: unknown) => {
  const one = single(value);
  return typeof one === 'string' && one.trim() === '' ? undefined : one;
};
const text = (max: number, message: string) =>
  z.preprocess(blankToUndefined, z.string().trim().max(max, message).optional());
const moment = (asEnd: boolean) =>
  z.preprocess(
    blankToUndefined,
    z
      .string()
      .optional()
      .transform((value, context) => {
        if (value === undefined) return undefined;
        const parsed = parseMoment(value.trim(), asEnd);
        if (!parsed)
          context.addIssue({
            code: 'custom',
            message: 'Use a date and time such as 2026-12-01T09:30 (UTC).',
          });
        return parsed ?? undefined;
      }),
  );

/** Filters of the audit trail, from a page's search parameters or the API's query string. */
export const auditFilterSchema = z
  .object({
    entityType: text(64, 'Record types are at most 64 characters.'),
    entityId: text(200, 'Record ids are at most 200 characters.'),
    userId: z.preprocess(blankToUndefined, z.uuid('Choose a person from the list.').optional()),
    from: moment(false),
    to: moment(true),
    page: z.preprocess(
      blankToUndefined,
      z.coerce
        .number('Pages are numbered from 1.')
        .int('Pages are numbered from 1.')
        .min(1, 'Pages are numbered from 1.')
        .max(1_000_000)
        .default(1),
    ),
  })
  .refine((filter) => !filter.from || !filter.to || filter.from < filter.to, {
    path: ['to'],
    message: 'The end of the range is before its start.',
  });

export type AuditFilter = z.output<typeof auditFilterSchema>;
