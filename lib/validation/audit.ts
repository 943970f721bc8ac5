import { z } from 'zod';
import { wallClockToUtc } from '@/lib/domain/time-zone';

/** Rows per page of the audit trail. */
export const AUDIT_PAGE_SIZE = 100;

const MOMENT = /^(\d{4}-\d{2}-\d{2})(?:T(\d{2}:\d{2})(:\d{2}(?:\.\d{1,3})?)?)?(Z|[+-]\d{2}:\d{2})?$/;

/**
 * A moment typed into a filter: a date, or a date and time (as a datetime-local field sends it), read on
 * the wall clock of `timeZone` (an IANA name, UTC unless given) unless it names its own offset. As the end
 * of a range it stands for the whole day, minute or second it names, so the bound returned is exclusive.
 */
export function parseMoment(text: string, asEnd: boolean, timeZone = 'UTC'): Date | null {
  const match = MOMENT.exec(text);
  if (!match) return null;
  const [, day, minute, seconds, zone] = match;
  const start = new Date(`${day}T${minute ?? '00:00'}${seconds ?? ''}${zone ?? 'Z'}`);
  if (Number.isNaN(start.getTime())) return null;
  if (!zone && start.toISOString().slice(0, 10) !== day) return null; // 2026-02-30 rolls over: refuse it
  const stepMs = !asEnd ? 0 : !minute ? 86_400_000 : !seconds ? 60_000 : seconds.includes('.') ? 1 : 1000;
  const bound = new Date(start.getTime() + stepMs);
  return zone ? bound : wallClockToUtc(bound, timeZone);
}

const single = (value: unknown) => (Array.isArray(value) ? value[0] : value);
const blankToUndefined = (value: unknown) => {
  const one = single(value);
  return typeof one === 'string' && one.trim() === '' ? undefined : one;
};
const text = (max: number, message: string) =>
  z.preprocess(blankToUndefined, z.string().trim().max(max, message).optional());
const moment = (asEnd: boolean, timeZone: string) =>
  z.preprocess(
    blankToUndefined,
    z
      .string()
      .optional()
      .transform((value, context) => {
        if (value === undefined) return undefined;
        const parsed = parseMoment(value.trim(), asEnd, timeZone);
        if (!parsed)
          context.addIssue({
            code: 'custom',
            message: `Use a date and time such as 2026-12-01T09:30 (${timeZone}).`,
          });
        return parsed ?? undefined;
      }),
  );

/**
 * Filters of the audit trail, from a page's search parameters or the API's query string: kind of object
 * and its id, kind of event, person, plate (by label: every plate of that label, its wells included),
 * compound (by identifier: its batches and aliases included) and a time range typed on the wall clock of
 * `timeZone`.
 */
export const auditFilterSchemaFor = (timeZone: string) => {
  // Built once per time zone: building it cost the audit page about 4 ms of CPU per request, twice.
  let schema = filterSchemas.get(timeZone);
  if (!schema) filterSchemas.set(timeZone, (schema = buildAuditFilterSchema(timeZone)));
  return schema;
};

const buildAuditFilterSchema = (timeZone: string) =>
  z
    .object({
      entityType: text(64, 'Kinds of object are at most 64 characters.'),
      entityId: text(200, 'Record ids are at most 200 characters.'),
      action: text(64, 'Kinds of event are at most 64 characters.'),
      userId: z.preprocess(blankToUndefined, z.uuid('Choose a person from the list.').optional()),
      plate: text(200, 'Plate labels are at most 200 characters.'),
      compound: text(200, 'Compound identifiers are at most 200 characters.'),
      from: moment(false, timeZone),
      to: moment(true, timeZone),
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

const filterSchemas = new Map<string, ReturnType<typeof buildAuditFilterSchema>>();

/** The filters read in UTC (times that name no offset). */
export const auditFilterSchema = auditFilterSchemaFor('UTC');

export type AuditFilter = z.output<typeof auditFilterSchema>;

/** The filter keys a page address carries (page apart). */
export const AUDIT_FILTER_KEYS = [
  'entityType',
  'entityId',
  'action',
  'userId',
  'plate',
  'compound',
  'from',
  'to',
] as const;

/**
 * The query of the audit filter's suggestions (GET /api/audit/suggestions): which field (plate labels
 * unless `compound` is asked for), and the text typed so far (nothing typed: the newest plates, the
 * first identifiers).
 */
export const auditSuggestionsSchema = z.object({
  kind: z.enum(['plate', 'compound'], { message: 'Ask for plate or compound suggestions.' }).default('plate'),
  q: z.string().trim().max(100, 'At most 100 characters.').default(''),
});
