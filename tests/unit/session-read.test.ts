import { sealData } from 'iron-session';
import { beforeAll, describe, expect, test } from 'vitest';
import { readSealedSession } from '@/lib/auth/session-read';

// The proxy and the pages read the session cookie through readSealedSession, which keeps cookies it
// unsealed for a minute (lib/auth/session-read.ts). Only cookies that unseal with Gatewell's secret count.
const password = 'gatewell-unit-secret-0123456789-abcdefghij';
const data = {
  userId: '00000000-0000-4000-8000-000000000001',
  sessionVersion: 3,
  issuedAt: 1,
  lastSeenAt: 2,
};

describe('reading the sealed session cookie', () => {
  beforeAll(() => {
    process.env.SESSION_SECRET = password;
  });

  test('a cookie sealed with the secret gives its data, the first time and from memory', async () => {
    const sealed = await sealData(data, { password, ttl: 3600 });
    expect(await readSealedSession(sealed)).toEqual(data);
    const again = await readSealedSession(sealed);
    expect(again).toEqual(data);
    again.userId = 'changed by a caller';
    expect(await readSealedSession(sealed)).toEqual(data);
  });

  test('no cookie, a forged one, one with a flipped character, and one sealed with another secret give no session', async () => {
    const sealed = await sealData(data, { password, ttl: 3600 });
    const flipped = sealed.slice(0, -3) + (sealed.at(-3) === 'A' ? 'B' : 'A') + sealed.slice(-2);
    const foreign = await sealData(data, { password: 'another-secret-0123456789-abcdefghijkl', ttl: 3600 });
    for (const cookie of [undefined, '', 'Fe26.2**forged', flipped, foreign])
      expect(await readSealedSession(cookie)).toEqual({});
  });

  test('a remembered cookie is unsealed again after a minute', async () => {
    const sealed = await sealData(data, { password, ttl: 3600 });
    const now = Date.now();
    expect(await readSealedSession(sealed, now)).toEqual(data);
    process.env.SESSION_SECRET = 'rotated-secret-0123456789-abcdefghijklmn';
    expect(await readSealedSession(sealed, now + 30_000)).toEqual(data);
    expect(await readSealedSession(sealed, now + 61_000)).toEqual({});
    process.env.SESSION_SECRET = password;
  });
});
