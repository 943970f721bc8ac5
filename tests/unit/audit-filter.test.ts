import { describe, expect, test } from 'vitest';
import { z } from 'zod';
import { auditFilterSchema, parseMoment } from '@/lib/validation/audit';

describe('moments typed into the audit filter', () => {
  test.each([
    ['2026-12-01', false, '2026-12-01T00:00:00.000Z'],
    ['2026-12-01', true, '2026-12-02T00:00:00.000Z'],
    ['2026-12-01T09:30', false, '2026-12-01T09:30:00.000Z'],
    ['2026-12-01T09:30', true, '2026-12-01T09:31:00.000Z'],
    ['2026-12-01T09:30:15', true, '2026-12-01T09:30:16.000Z'],
    ['2026-12-01T10:30+01:00', false, '2026-12-01T09:30:00.000Z'],
  ])('%s (as end: %s) is %s UTC', (text, asEnd, iso) => {
    expect(parseMoment(text, asEnd)?.toISOString()).toBe(iso);
  });

  test.each(['yesterday', '2026-02-30', '2026-12-01T25:00', '01/12/2026'])('%s is refused', (text) => {
    expect(parseMoment(text, false)).toBeNull();
  });
});

describe('the audit filter schema', () => {
  const errorsOf = (input: unknown) => {
    const parsed = auditFilterSchema.safeParse(input);
    return parsed.success ? {} : z.flattenError(parsed.error).fieldErrors;
  };

  test('empty fields, repeated parameters and the page number are read as a browser sends them', () => {
    expect(
      auditFilterSchema.parse({ entityType: ['plate', 'user'], entityId: '', userId: '', page: '3' }),
    ).toEqual({ entityType: 'plate', page: 3 });
    expect(auditFilterSchema.parse({})).toEqual({ page: 1 });
  });

  test.each([
    [{ from: 'soon' }, { from: ['Use a date and time such as 2026-12-01T09:30 (UTC).'] }],
    [{ from: '2026-12-02', to: '2026-12-01' }, { to: ['The end of the range is before its start.'] }],
    [{ userId: 'ada' }, { userId: ['Choose a person from the list.'] }],
    [{ page: '0' }, { page: ['Pages are numbered from 1.'] }],
    [{ entityType: 'x'.repeat(65) }, { entityType: ['Record types are at most 64 characters.'] }],
  ])('%o is refused with %o', (input, expected) => {
    expect(errorsOf(input)).toEqual(expected);
  });
});
