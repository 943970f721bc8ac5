import { describe, expect, test } from 'vitest';
import { changeSummary } from '@/app/(app)/audit/change-summary';

describe('the before → after line of the audit trail', () => {
  test.each([
    [
      { roles: ['biologist'], name: 'Bea' },
      { roles: ['approver', 'biologist'], name: 'Bea' },
      'roles: biologist → approver, biologist',
    ],
    [
      { enabled: true, sessionVersion: 2 },
      { enabled: false, sessionVersion: 3 },
      'enabled: true → false; sessionVersion: 2 → 3',
    ],
    [null, { email: 'nia@example.org', roles: [] }, 'email: nia@example.org; roles: none'],
    [{ lot: 'L1' }, null, 'removed: lot: L1'],
    [{ a: 1 }, { a: 1 }, 'no field changed'],
    [null, null, '—'],
    ['imported', 'verified', 'imported → verified'],
  ])('%o → %o reads "%s"', (before, after, expected) => {
    expect(changeSummary(before, after)).toBe(expected);
  });
});
