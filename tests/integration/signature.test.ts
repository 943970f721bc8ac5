import { createHash, randomUUID } from 'node:crypto';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { canonicalJson } from '@/lib/auth/canonical-json';
import { MAX_FAILURES_PER_ACCOUNT } from '@/lib/auth/sign-in';
import { signRecord } from '@/lib/auth/signature';
import { db } from '@/lib/db';
import { AuditEvent, LoginAttempt, Signature } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

const PASSWORD = 'approver-pass-1';
const content = { plate: 'GW-0001', state: 'submitted', fits: [{ target: 'NaV', ic50_uM: 1.25, hill: 1.1 }] };

async function sign(overrides: Record<string, unknown> = {}, entityId = randomUUID()) {
  const actor = await makeActor(['approver'], `ana-${entityId.slice(0, 8)}@example.org`, PASSWORD);
  const input = {
    password: PASSWORD,
    meaning: 'Approved: results are complete and correct',
    comment: 'ok',
    entityType: 'plate',
    entityId,
    content,
    ...overrides,
  };
  return { actor, input, entityId };
}

describe('electronic signatures against the real database', () => {
  beforeEach(async () => {
    await resetDatabase();
  });
  afterAll(async () => {
    await db().close();
  });

  test('a signature records signer, meaning, comment, time and the hash of the canonical content, with its audit event', async () => {
    const { actor, input, entityId } = await sign();
    const before = Date.now();
    const signature = await db().transaction((transaction) => signRecord(actor, input, transaction));
    const after = Date.now();
    const expectedHash = createHash('sha256').update(canonicalJson(content)).digest('hex');
    expect(signature).toMatchObject({
      signerId: actor.id,
      signerName: actor.name,
      meaning: input.meaning,
      comment: 'ok',
      entityType: 'plate',
      entityId,
      contentSha256: expectedHash,
    });
    // The time of signing is the time of this call (the same machine's clock; milliseconds): not a stored
    // or default time, nor one in another time zone.
    expect(Date.parse(signature.signedAt)).toBeGreaterThanOrEqual(before);
    expect(Date.parse(signature.signedAt)).toBeLessThanOrEqual(after);
    expect(await Signature.count({ where: { entityId } })).toBe(1);
    const event = await AuditEvent.findOne({ where: { action: 'sign', entityId }, raw: true });
    expect(event).toMatchObject({
      actorId: actor.id,
      entityType: 'plate',
      after: { signatureId: signature.id, contentSha256: expectedHash },
    });
  });

  test('the same content in another key order gives the same hash; changed content gives another', async () => {
    const { actor, input, entityId } = await sign();
    const reordered = {
      fits: [{ hill: 1.1, ic50_uM: 1.25, target: 'NaV' }],
      state: 'submitted',
      plate: 'GW-0001',
    };
    const changed = { ...content, fits: [{ target: 'NaV', ic50_uM: 1.3, hill: 1.1 }] };
    const [a, b, c] = await db().transaction(async (transaction) => [
      await signRecord(actor, input, transaction),
      await signRecord(actor, { ...input, content: reordered }, transaction),
      await signRecord(actor, { ...input, content: changed }, transaction),
    ]);
    expect(b!.contentSha256).toBe(a!.contentSha256);
    expect(c!.contentSha256).not.toBe(a!.contentSha256);
    expect(await Signature.count({ where: { entityId } })).toBe(3);
  });

  test('a wrong password is refused, signs nothing, and counts as a failed attempt that survives the rollback', async () => {
    const { actor, input, entityId } = await sign({ password: 'not-my-password' });
    await expect(
      db().transaction((transaction) => signRecord(actor, input, transaction)),
    ).rejects.toMatchObject({
      code: 'invalid',
      details: { fieldErrors: { password: ['That password is not right.'] } },
    });
    expect(await Signature.count()).toBe(0);
    expect(await LoginAttempt.count({ where: { email: actor.email, succeeded: false } })).toBe(1);
    expect(await AuditEvent.count({ where: { action: 'sign_failed', entityId, actorId: actor.id } })).toBe(1);
  });

  test(`after ${MAX_FAILURES_PER_ACCOUNT} wrong passwords signing is throttled, even with the right one`, async () => {
    const { actor, input } = await sign();
    for (let i = 0; i < MAX_FAILURES_PER_ACCOUNT; i += 1) {
      await db()
        .transaction((t) => signRecord(actor, { ...input, password: `wrong-${i}` }, t))
        .catch(() => undefined);
    }
    await expect(db().transaction((t) => signRecord(actor, input, t))).rejects.toMatchObject({
      code: 'rate_limited',
    });
    expect(await Signature.count()).toBe(0);
  });

  test('the signature and its audit event roll back with the caller’s transaction', async () => {
    const { actor, input, entityId } = await sign();
    await expect(
      db().transaction(async (transaction) => {
        await signRecord(actor, input, transaction);
        throw new Error('the plate transition failed after signing');
      }),
    ).rejects.toThrow('the plate transition failed');
    expect(await Signature.count()).toBe(0);
    expect(await AuditEvent.count({ where: { action: 'sign', entityId } })).toBe(0);
  });

  test.each([
    [{ meaning: '   ' }, 'meaning', 'State what your signature means.'],
    [{ password: '' }, 'password', 'Enter your password to sign.'],
    [{ entityId: 'GW-0001' }, 'entityId', 'The signed record must be named by its id.'],
    [{ content: undefined }, 'content', 'There is nothing to sign.'],
  ])(
    'an incomplete signature is refused before the password is checked (%o)',
    async (overrides, field, message) => {
      const { actor, input } = await sign(overrides);
      await expect(db().transaction((t) => signRecord(actor, input, t))).rejects.toMatchObject({
        code: 'invalid',
        details: { fieldErrors: { [field]: [message] } },
      });
      expect(await LoginAttempt.count()).toBe(0);
    },
  );
});
