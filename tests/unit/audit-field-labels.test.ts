import { describe, expect, test } from 'vitest';
import {
  changeText,
  EVENT_KIND_LABELS,
  fieldChanges,
  fieldLabel,
  objectKindLabel,
  readableName,
} from '@/lib/audit/field-labels';
import { formatInZone, wallClockText } from '@/lib/domain/time-zone';

// The words of the audit trail: each expected line is written out here by hand from the field table's
// intent (labels and units people read), not taken from the app's output.

describe('field labels', () => {
  test.each([
    ['molecularWeight', 'Molecular weight (g/mol)'],
    ['sealResistanceMin_GOhm', 'Lowest seal resistance (GΩ)'],
    ['exclusionReason', 'Reason for exclusion'],
    ['screenId', 'Screen'],
  ])('%s reads %s', (key, label) => {
    expect(fieldLabel(key)).toBe(label);
  });

  test.each([
    ['holdingPotential_mV', 'Holding potential (mV)'],
    ['some_snake_field', 'Some snake field'],
    ['HTTPStatusCode', 'Http status code'],
    ['operatorId', 'Operator'],
    ['n', 'N'],
  ])('an unknown field %s falls back to %s, never camelCase', (key, label) => {
    expect(readableName(key)).toBe(label);
    expect(fieldLabel(key)).toBe(label);
  });

  test('kinds of object and event read as words; unknown ones lose their underscores', () => {
    expect(objectKindLabel('compound_alias')).toBe('Compound alias');
    expect(objectKindLabel('new_thing')).toBe('New thing');
    expect(EVENT_KIND_LABELS.exclude_well).toBe('Well excluded');
  });
});

describe('changes as field: before → after', () => {
  const screen = '0b7f4d0e-3a9c-4c8e-9d3f-1c2b3a4d5e6f';
  test.each<[unknown, unknown, string]>([
    [
      { roles: ['biologist'], name: 'Bea' },
      { roles: ['approver', 'biologist'], name: 'Bea' },
      'Roles: biologist → approver, biologist',
    ],
    [
      { enabled: true, sessionVersion: 2 },
      { enabled: false, sessionVersion: 3 },
      'Account enabled: yes → no',
    ],
    [null, { email: 'nia@example.org', roles: [] }, 'E-mail: nia@example.org; Roles: none'],
    [{ lot: 'L1' }, null, 'Lot: L1 → removed'],
    [{ a: 1 }, { a: 1 }, 'no field changed'],
    [null, null, '—'],
    ['imported', 'verified', 'Value: imported → verified'],
    [null, { screenId: screen, sha256: 'ab'.repeat(32) }, 'Screen: Pain sodium screen'],
    [null, { screenId: '11111111-2222-4333-8444-555555555555' }, 'Screen: a record no longer known'],
    [{ molecularWeight: 300 }, { molecularWeight: 312.5 }, 'Molecular weight (g/mol): 300 → 312.5'],
  ])('%o → %o reads "%s"', (before, after, expected) => {
    expect(changeText(before, after, { [screen]: 'Pain sodium screen' })).toBe(expected);
  });

  test('a field missing on one side and empty on the other is no change; nothing to something is', () => {
    expect(fieldChanges({ reason: '' }, { reason: null, comment: undefined })).toEqual([]);
    expect(fieldChanges({ label: 'NAV-P01' }, { label: 'NAV-P01', reason: '' })).toEqual([]);
    // A field the after-record does not hold was not recorded, so it is not shown as removed.
    expect(fieldChanges({ state: 'submitted', verifiedBy: 'x' }, { state: 'approved' })).toEqual([
      { field: 'State', before: 'submitted', after: 'approved' },
    ]);
    expect(fieldChanges({ reason: null }, { reason: 'seal lost' })).toEqual([
      { field: 'Reason', before: '—', after: 'seal lost' },
    ]);
  });

  test('a change keeps before and after apart for the detail table', () => {
    expect(fieldChanges({ excluded: false }, { excluded: true })).toEqual([
      { field: 'Excluded', before: 'no', after: 'yes' },
    ]);
  });
});

describe('times in a zone', () => {
  // Offsets from memory of the IANA tz database (CET = UTC+1 in winter, CEST = UTC+2 in summer).
  test('a moment shows its zone and the wall clock of that zone', () => {
    expect(formatInZone('2026-12-05T08:31:00Z', 'Europe/Berlin')).toBe('Sat, 5 Dec 2026, 09:31:00 CET');
    expect(formatInZone('2026-07-01T08:31:00Z', 'Europe/Berlin')).toBe('Wed, 1 Jul 2026, 10:31:00 CEST');
    expect(formatInZone('2026-12-05T08:31:00Z', 'UTC')).toBe('Sat, 5 Dec 2026, 08:31:00 UTC');
    expect(wallClockText('2026-07-01T08:31:00Z', 'Europe/Berlin')).toBe('2026-07-01T10:31:00');
  });
});
