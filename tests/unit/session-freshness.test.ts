import limits from '../fixtures/check-values/session-limits-common-practice.json';
import { describe, expect, test } from 'vitest';
import { ABSOLUTE_TIMEOUT_MS, IDLE_TIMEOUT_MS, sessionIsFresh } from '@/lib/auth/session-config';

// Gatewell's session limits: 30 minutes idle, 12 hours in all (common practice, no source:
// session-limits-common-practice.json).
const now = Date.UTC(2026, 11, 1, 12);
const minutes = (n: number) => n * 60_000;

describe('session freshness', () => {
  test('the limits are 30 minutes idle and 12 hours absolute', () => {
    expect(IDLE_TIMEOUT_MS).toBe(minutes(limits.idleTimeout_minutes));
    expect(ABSOLUTE_TIMEOUT_MS).toBe(minutes(limits.absoluteTimeout_hours * 60));
  });

  test.each([
    ['just signed in', { issuedAt: now, lastSeenAt: now }, true],
    ['active 29 minutes ago', { issuedAt: now - minutes(60), lastSeenAt: now - minutes(29) }, true],
    ['idle for 30 minutes', { issuedAt: now - minutes(60), lastSeenAt: now - minutes(30) }, false],
    [
      'signed in 12 hours ago, active a minute ago',
      { issuedAt: now - minutes(720), lastSeenAt: now - minutes(1) },
      false,
    ],
    ['no user', { userId: undefined, issuedAt: now, lastSeenAt: now }, false],
  ])('%s → %s', (_name, times, fresh) => {
    expect(sessionIsFresh({ userId: 'u', sessionVersion: 1, ...times }, now)).toBe(fresh);
  });
});
