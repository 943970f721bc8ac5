import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { listOutbox, outboxCounts } from '@/lib/mail/admin';
import { listPlateWells } from '@/lib/plates/detail';
import { setWellExclusion } from '@/lib/plates/review';
import { plateHistory } from '@/lib/signoff/history';
import { signoffPanel } from '@/lib/signoff/panel';
import { signPlateStep } from '@/lib/signoff/service';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';
import { fitsCurrent } from '../support/jobs';

describe('plate history, the sign-off panel and the outbox listing', () => {
  let cast: SignoffCast;
  beforeEach(async () => {
    await resetDatabase();
    cast = await signoffCast();
  });
  afterAll(() => db().close());

  test('the history holds every audit event of the plate and its wells in order, signatures with meaning and hash', async () => {
    await signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: PASSWORD });
    const [well] = await listPlateWells(cast.biologist, cast.plateId);
    await setWellExclusion(cast.biologist, cast.plateId, {
      wellIds: [well!.id],
      excluded: true,
      reason: 'bubble',
    });
    await fitsCurrent(cast.plateId);
    await expect(
      signPlateStep(cast.biologist, cast.plateId, { action: 'submit', password: 'wrong-password' }),
    ).rejects.toMatchObject({ code: 'invalid' });
    const submitted = await signPlateStep(cast.biologist, cast.plateId, {
      action: 'submit',
      password: PASSWORD,
      comment: 'ready',
    });
    const history = await plateHistory(cast.approver, cast.plateId);
    expect(history.map((e) => e.action)).toEqual([
      'import',
      'sign',
      'verify',
      'exclude_well',
      'sign_failed',
      'sign',
      'submit',
    ]);
    expect(history.map((e) => e.id)).toEqual([...history.map((e) => e.id)].sort((a, b) => a - b));
    expect(history[3]).toMatchObject({ entityType: 'well', wellPosition: well!.position, reason: 'bubble' });
    expect(history[5]!.signature).toMatchObject({
      meaning: expect.stringMatching(/^Reviewed and submitted/),
      comment: 'ready',
      contentSha256: submitted.contentSha256,
    });
    expect(history[6]).toMatchObject({
      actorName: cast.biologist.name,
      reason: 'ready',
      before: { state: 'verified' },
      after: { state: 'submitted', signatureId: submitted.signatureId },
    });
  });

  test('the panel offers each person exactly the steps they may sign, and says why not otherwise', async () => {
    expect((await signoffPanel(cast.chemist, cast.plateId)).choices.map((c) => c.action)).toEqual(['verify']);
    expect(await signoffPanel(cast.approver, cast.plateId)).toMatchObject({
      choices: [],
      notYours: 'This step needs the chemist role.',
      waitingFor: 'Waiting for a chemist to verify the compound map.',
    });
    await signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: PASSWORD });
    await signPlateStep(cast.biologist, cast.plateId, { action: 'submit', password: PASSWORD });
    const panel = await signoffPanel(cast.approver, cast.plateId);
    expect(panel.choices.map((c) => [c.action, c.commentRequired])).toEqual([
      ['approve', false],
      ['reject', true],
    ]);
    expect(panel).toMatchObject({
      state: 'submitted',
      signers: {
        importedBy: cast.biologist.name,
        verifiedBy: cast.chemist.name,
        submittedBy: cast.biologist.name,
      },
    });
    expect(panel.lastSignature?.contentSha256).toBe(panel.currentSha256);
    const importerApprover = await makeActor(['biologist', 'approver']);
    await db().query('update plates set imported_by = :id where id = :plateId', {
      replacements: { id: importerApprover.id, plateId: cast.plateId },
    });
    expect(await signoffPanel(importerApprover, cast.plateId)).toMatchObject({
      choices: [],
      notYours: 'You imported this plate, so another approver decides on it.',
    });
  });

  test('the outbox listing is for admins and shows each message with its delivery state', async () => {
    await expect(listOutbox(cast.approver)).rejects.toMatchObject({
      code: 'forbidden',
      message: 'This needs the admin role.',
    });
    const rows = await listOutbox(cast.admin);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      kind: 'plate_imported',
      plateLabel: 'NAV-P01',
      toAddress: cast.chemist.email,
      state: 'queued',
      attempts: 0,
      maxAttempts: 8,
    });
    expect(await outboxCounts(cast.admin)).toEqual({ queued: 1, sent: 0, failed: 0 });
    expect(await listOutbox(cast.admin, { state: 'sent' })).toEqual([]);
  });
});
