import { describe, expect, test } from 'vitest';
import { z } from 'zod';
import { auditFilterSchema, auditFilterSchemaFor, parseMoment } from '@/lib/validation/audit';

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

  // Zone rules from memory of the IANA tz database: Europe/Berlin is UTC+1 in winter and UTC+2 from the
  // last Sunday of March (29 March 2026, 02:00 → 03:00) to the last Sunday of October (25 October 2026,
  // 03:00 → 02:00); America/New_York is UTC−5 in December.
  test.each([
    ['2026-12-01T09:30', false, 'Europe/Berlin', '2026-12-01T08:30:00.000Z'],
    ['2026-07-01T09:30', false, 'Europe/Berlin', '2026-07-01T07:30:00.000Z'],
    ['2026-07-01', true, 'Europe/Berlin', '2026-07-01T22:00:00.000Z'],
    ['2026-12-01T09:30', true, 'America/New_York', '2026-12-01T14:31:00.000Z'],
    // 02:30 on 29 March does not exist in Berlin: read with the winter offset, it is 03:30 summer time.
    ['2026-03-29T02:30', false, 'Europe/Berlin', '2026-03-29T01:30:00.000Z'],
    // 02:30 on 25 October happens twice in Berlin: the earlier, summer-time one is taken.
    ['2026-10-25T02:30', false, 'Europe/Berlin', '2026-10-25T00:30:00.000Z'],
    // A time that names its offset ignores the zone.
    ['2026-12-01T10:30+01:00', false, 'America/New_York', '2026-12-01T09:30:00.000Z'],
  ])('%s (as end: %s) in %s is %s', (text, asEnd, zone, iso) => {
    expect(parseMoment(text, asEnd, zone)?.toISOString()).toBe(iso);
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
    [{ entityType: 'x'.repeat(65) }, { entityType: ['Kinds of object are at most 64 characters.'] }],
  ])('%o is refused with %o', (input, expected) => {
    expect(errorsOf(input)).toEqual(expected);
  });
});

describe('the audit filter in a configured zone', () => {
  test('its message names the zone, and plate, compound and kind of event are read as typed', () => {
    const schema = auditFilterSchemaFor('Europe/Berlin');
    const parsed = schema.safeParse({ from: 'soon' });
    expect(parsed.success ? {} : z.flattenError(parsed.error).fieldErrors).toEqual({
      from: ['Use a date and time such as 2026-12-01T09:30 (Europe/Berlin).'],
    });
    expect(schema.parse({ plate: ' NAV-P01 ', compound: 'GW-1', action: 'sign', page: '' })).toEqual({
      plate: 'NAV-P01',
      compound: 'GW-1',
      action: 'sign',
      page: 1,
    });
  });
});
