import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { listPlateWells } from '@/lib/plates/detail';
import { setWellExclusion } from '@/lib/plates/review';
import { signPlateStep } from '@/lib/signoff/service';
import { Plate, Signature, SignoffEvent } from '@/models';
import { resetDatabase } from '../support/database';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';

describe('the approval lock and two people deciding at once', () => {
  let cast: SignoffCast;
  beforeEach(async () => {
    await resetDatabase();
    cast = await signoffCast();
    await signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: PASSWORD });
    await signPlateStep(cast.biologist, cast.plateId, { action: 'submit', password: PASSWORD });
  });
  afterAll(() => db().close());

  test('two approvers approving at once end with one approval; the other is told who approved', async () => {
    const { version } = (await Plate.findByPk(cast.plateId))!;
    const results = await Promise.allSettled(
      [cast.approver, cast.approver2].map((actor) =>
        signPlateStep(actor, cast.plateId, {
          action: 'approve',
          password: PASSWORD,
          expectedVersion: version,
        }),
      ),
    );
    const won = results.filter((r) => r.status === 'fulfilled');
    const lost = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    const winner = results[0]!.status === 'fulfilled' ? cast.approver : cast.approver2;
    expect(lost[0]!.reason).toMatchObject({
      code: 'locked',
      message: expect.stringMatching(
        new RegExp(`^Plate NAV-P01 was approved by ${winner.name} \\(.+ UTC\\) and is locked`),
      ),
    });
    expect(await SignoffEvent.count({ where: { plateId: cast.plateId, toState: 'approved' } })).toBe(1);
    expect(await Signature.count({ where: { entityId: cast.plateId } })).toBe(3);
    expect((await Plate.findByPk(cast.plateId))!).toMatchObject({
      state: 'approved',
      version: version + 1,
      decidedBy: winner.id,
    });
  });

  test('an approval and a return at once end with exactly one decision', async () => {
    const results = await Promise.allSettled([
      signPlateStep(cast.approver, cast.plateId, { action: 'approve', password: PASSWORD }),
      signPlateStep(cast.approver2, cast.plateId, {
        action: 'reject',
        password: PASSWORD,
        comment: 'Z′ too low on Nav1.7',
      }),
    ]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    const [loser] = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(['locked', 'conflict']).toContain(loser!.reason.code);
    expect(loser!.reason.message).toMatch(/Nothing was signed/);
    expect(await SignoffEvent.count({ where: { plateId: cast.plateId, fromState: 'submitted' } })).toBe(1);
  });

  test('an approved plate is locked: no further step, no exclusion, and the database refuses direct changes', async () => {
    await signPlateStep(cast.approver, cast.plateId, { action: 'approve', password: PASSWORD });
    await expect(
      signPlateStep(cast.approver2, cast.plateId, {
        action: 'reject',
        password: PASSWORD,
        comment: 'second thoughts',
      }),
    ).rejects.toMatchObject({
      code: 'locked',
      message: expect.stringContaining(
        'is locked: no signature, edit or exclusion can change it. A correction is a new import that references it.',
      ),
    });
    await expect(
      signPlateStep(cast.biologist, cast.plateId, { action: 'rework', password: PASSWORD }),
    ).rejects.toMatchObject({ code: 'locked' });
    const [well] = await listPlateWells(cast.biologist, cast.plateId);
    await expect(
      setWellExclusion(cast.biologist, cast.plateId, {
        wellIds: [well!.id],
        excluded: true,
        reason: 'late doubt',
      }),
    ).rejects.toMatchObject({ code: 'locked' });
    const replacements = { plateId: cast.plateId, wellId: well!.id };
    for (const sql of [
      "update plates set state = 'rejected' where id = :plateId",
      "update wells set excluded = true, exclusion_reason = 'x' where id = :wellId",
      'update readouts set fractional_block = 0 where well_id = :wellId',
      'delete from fits where plate_id = :plateId',
    ]) {
      await expect(db().query(sql, { replacements })).rejects.toThrow(/approved and locked/);
    }
    expect((await Plate.findByPk(cast.plateId))!.state).toBe('approved');
  });
});
