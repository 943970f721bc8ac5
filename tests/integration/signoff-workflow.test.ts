import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { listPlateWells } from '@/lib/plates/detail';
import { setWellExclusion } from '@/lib/plates/review';
import { plateContentSha256 } from '@/lib/signoff/plate-content';
import { signPlateStep } from '@/lib/signoff/service';
import { AuditEvent, MailMessage, Plate, Signature, SignoffEvent } from '@/models';
import { resetDatabase } from '../support/database';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';
import { fitsCurrent } from '../support/jobs';

describe('plate sign-off on the real database', () => {
  let cast: SignoffCast;
  beforeEach(async () => {
    await resetDatabase();
    cast = await signoffCast();
  });
  afterAll(() => db().close());

  const plate = async () =>
    (await Plate.findByPk(cast.plateId, { rejectOnEmpty: true })).get({ plain: true });

  test('every step of the path moves the state, sets who signed, bumps the version and signs the data hash', async () => {
    const { chemist, biologist, approver, approver2, plateId } = cast;
    const path = [
      [chemist, 'verify', 'verified', ''],
      [biologist, 'submit', 'submitted', 'QC reviewed'],
      [approver, 'reject', 'rejected', 'Well B03 looks like a bubble; re-check the exclusions.'],
      [biologist, 'rework', 'imported', 'Re-checking B03'],
      [chemist, 'verify', 'verified', ''],
      [biologist, 'submit', 'submitted', ''],
      [approver2, 'approve', 'approved', 'Accepted'],
    ] as const;
    for (const [index, [actor, action, state, comment]] of path.entries()) {
      const before = await plate();
      const hashBefore = await plateContentSha256(plateId);
      const result = await signPlateStep(actor, plateId, {
        action,
        password: PASSWORD,
        comment,
        expectedVersion: before.version,
      });
      const after = await plate();
      expect(after.state).toBe(state);
      expect(after.version).toBe(before.version + 1);
      expect(result).toMatchObject({ state, version: after.version, contentSha256: hashBefore });
      const signature = await Signature.findByPk(result.signatureId, { rejectOnEmpty: true });
      expect(signature).toMatchObject({
        signerId: actor.id,
        entityType: 'plate',
        entityId: plateId,
        comment,
        contentSha256: hashBefore,
      });
      expect(await SignoffEvent.count({ where: { plateId } })).toBe(index + 1);
      expect(
        await AuditEvent.count({ where: { action, entityId: plateId, actorId: actor.id } }),
      ).toBeGreaterThan(0);
    }
    const final = await plate();
    expect(final).toMatchObject({
      verifiedBy: chemist.id,
      submittedBy: biologist.id,
      decidedBy: approver2.id,
      importedBy: biologist.id,
    });
    const events = await SignoffEvent.findAll({
      where: { plateId },
      order: [
        ['occurredAt', 'ASC'],
        ['id', 'ASC'],
      ],
    });
    expect(events.map((e) => `${e.fromState}>${e.toState}`)).toEqual([
      'imported>verified',
      'verified>submitted',
      'submitted>rejected',
      'rejected>imported',
      'imported>verified',
      'verified>submitted',
      'submitted>approved',
    ]);
  });

  test('rework clears the round’s signers, and an edit after verification gives the next signature another hash', async () => {
    const { chemist, biologist, approver, plateId } = cast;
    const verified = await signPlateStep(chemist, plateId, { action: 'verify', password: PASSWORD });
    const [well] = await listPlateWells(biologist, plateId);
    await setWellExclusion(biologist, plateId, {
      wellIds: [well!.id],
      excluded: true,
      reason: 'seal lost during recording',
    });
    await fitsCurrent(plateId);
    const submitted = await signPlateStep(biologist, plateId, { action: 'submit', password: PASSWORD });
    expect(submitted.contentSha256).not.toBe(verified.contentSha256);
    await signPlateStep(approver, plateId, {
      action: 'reject',
      password: PASSWORD,
      comment: 'Explain the exclusion.',
    });
    await signPlateStep(biologist, plateId, { action: 'rework', password: PASSWORD });
    expect(await plate()).toMatchObject({
      state: 'imported',
      verifiedBy: null,
      submittedBy: null,
      decidedBy: null,
    });
  });

  test('a wrong password is refused beside the field, audited, and changes nothing', async () => {
    const before = await plate();
    const mailBefore = await MailMessage.count();
    await expect(
      signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: 'not-my-password' }),
    ).rejects.toMatchObject({
      code: 'invalid',
      message: 'That password is not right.',
      details: { fieldErrors: { password: ['That password is not right.'] } },
    });
    expect(await plate()).toMatchObject({ state: 'imported', version: before.version, verifiedBy: null });
    expect(await SignoffEvent.count()).toBe(0);
    expect(await Signature.count()).toBe(0);
    expect(await MailMessage.count()).toBe(mailBefore);
    expect(
      await AuditEvent.count({
        where: { action: 'sign_failed', entityId: cast.plateId, actorId: cast.chemist.id },
      }),
    ).toBe(1);
  });

  test('a rejection without a comment is refused with the reason beside the comment field', async () => {
    await signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: PASSWORD });
    await signPlateStep(cast.biologist, cast.plateId, { action: 'submit', password: PASSWORD });
    await expect(
      signPlateStep(cast.approver, cast.plateId, { action: 'reject', password: PASSWORD, comment: '   ' }),
    ).rejects.toMatchObject({
      code: 'invalid',
      details: {
        fieldErrors: {
          comment: ['Say why the plate is returned; the biologist reworks it from your comment.'],
        },
      },
    });
    expect((await plate()).state).toBe('submitted');
    expect(await SignoffEvent.count()).toBe(2);
  });

  test.each([
    ['the wrong role', 'biologist', 'verify', 'forbidden', 'This needs the chemist role.'],
    [
      'a step the state does not allow',
      'approver',
      'approve',
      'conflict',
      '“Approve” needs a plate that is submitted and waiting for a decision',
    ],
  ] as const)('%s is refused', async (_case, who, action, code, message) => {
    await expect(
      signPlateStep(cast[who], cast.plateId, { action, password: PASSWORD }),
    ).rejects.toMatchObject({ code, message: expect.stringContaining(message) });
    expect((await plate()).state).toBe('imported');
  });

  test('a stale version is refused: someone changed the plate after the signer opened it', async () => {
    const { version } = await plate();
    await expect(
      signPlateStep(cast.chemist, cast.plateId, {
        action: 'verify',
        password: PASSWORD,
        expectedVersion: version + 5,
      }),
    ).rejects.toMatchObject({
      code: 'conflict',
      message:
        'Plate NAV-P01 changed after you opened it; reload the page and check it before you sign. Nothing was signed.',
    });
  });
});
