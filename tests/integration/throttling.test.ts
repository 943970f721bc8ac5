import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import {
  MAX_FAILURES_PER_ACCOUNT,
  MAX_FAILURES_PER_ADDRESS,
  signIn,
  THROTTLE_WINDOW_MS,
} from '@/lib/auth/sign-in';
import { db } from '@/lib/db';
import { AuditEvent, LoginAttempt } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

describe('sign-in throttling stored in PostgreSQL', () => {
  beforeEach(async () => {
    await resetDatabase();
  });
  afterAll(async () => {
    await db().close();
  });

  test(`after ${MAX_FAILURES_PER_ADDRESS} failures from one address, that address is throttled for every account`, async () => {
    await makeActor(['biologist'], 'bea@example.org', 'bea-password-1');
    // Guessing across many accounts from one address: each account stays below its own limit.
    await LoginAttempt.bulkCreate(
      Array.from({ length: MAX_FAILURES_PER_ADDRESS }, (_, i) => ({
        email: `guess-${i}@example.org`,
        address: '203.0.113.7',
        succeeded: false,
      })),
    );
    await expect(signIn('bea@example.org', 'bea-password-1', '203.0.113.7')).resolves.toEqual({
      ok: false,
      reason: 'throttled',
    });
    await expect(signIn('bea@example.org', 'bea-password-1', '203.0.113.8')).resolves.toMatchObject({
      ok: true,
    });
    expect(await AuditEvent.count({ where: { action: 'sign_in_throttled' } })).toBe(1);
  });

  test('failures older than the window no longer count, and successes never do', async () => {
    await makeActor(['biologist'], 'bea@example.org', 'bea-password-1');
    const old = new Date(Date.now() - THROTTLE_WINDOW_MS - 60_000);
    await LoginAttempt.bulkCreate(
      Array.from({ length: MAX_FAILURES_PER_ACCOUNT }, () => ({
        email: 'bea@example.org',
        address: '198.51.100.1',
        succeeded: false,
        attemptedAt: old,
      })),
    );
    await LoginAttempt.bulkCreate(
      Array.from({ length: MAX_FAILURES_PER_ACCOUNT }, () => ({
        email: 'bea@example.org',
        address: '198.51.100.1',
        succeeded: true,
      })),
    );
    await expect(signIn('bea@example.org', 'bea-password-1', '198.51.100.1')).resolves.toMatchObject({
      ok: true,
    });
  });

  test('a throttled attempt is answered without checking the password, and is not itself counted', async () => {
    await makeActor(['biologist'], 'bea@example.org', 'bea-password-1');
    await LoginAttempt.bulkCreate(
      Array.from({ length: MAX_FAILURES_PER_ACCOUNT }, () => ({
        email: 'bea@example.org',
        address: '198.51.100.2',
        succeeded: false,
      })),
    );
    const before = await LoginAttempt.count();
    await expect(signIn('BEA@example.org', 'wrong', '198.51.100.9')).resolves.toEqual({
      ok: false,
      reason: 'throttled',
    });
    expect(await LoginAttempt.count()).toBe(before);
  });
});
