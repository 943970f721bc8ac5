import { QueryTypes } from 'sequelize';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listPlateFits, listPlateWells } from '@/lib/plates/detail';
import { setFitModel, setWellExclusion } from '@/lib/plates/review';
import { AuditEvent, ComputeJob, Plate, Well } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';
import { fitsCurrent } from '../support/jobs';

describe('plate review on the real database', () => {
  let biologist: Actor;
  let plateId: string;

  beforeEach(async () => {
    await resetDatabase();
    const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    biologist = await makeActor(['biologist']);
    plateId = await importDemoPlate(biologist, screens, 'nav-96-plate-01.xlsx');
  });
  afterAll(() => db().close());

  const fitOf = async (compound: string) =>
    (await listPlateFits(biologist, plateId)).find((f) => f.compound === compound)!;

  test('excluding a well with a reason marks the fits pending, queues the refit, and audits the change', async () => {
    const before = await fitOf('GW-0001');
    const well = (await listPlateWells(biologist, plateId)).find(
      (w) => w.compound === 'GW-0001' && w.qcReasons.length === 0,
    )!;
    const result = await setWellExclusion(biologist, plateId, {
      wellIds: [well.id],
      excluded: true,
      reason: 'bubble seen in the trace',
    });
    expect(result.changed).toBe(1);
    expect(await ComputeJob.count({ where: { plateId, kind: 'plate-fits' } })).toBe(2); // the import's and this change's
    await fitsCurrent(plateId);
    const after = await fitOf('GW-0001');
    expect(after.n).toBe(before.n - 1);
    expect(after.ic50_uM).not.toBe(before.ic50_uM);
    expect(
      await AuditEvent.count({
        where: { action: 'exclude_well', entityId: well.id, reason: 'bubble seen in the trace' },
      }),
    ).toBe(1);
    await setWellExclusion(biologist, plateId, {
      wellIds: [well.id],
      excluded: false,
      reason: 'trace re-read: fine',
    });
    await fitsCurrent(plateId);
    expect((await fitOf('GW-0001')).n).toBe(before.n);
  });

  test('a reason is required, and another role may not exclude', async () => {
    const [well] = await listPlateWells(biologist, plateId);
    await expect(
      setWellExclusion(biologist, plateId, { wellIds: [well!.id], excluded: true, reason: '  ' }),
    ).rejects.toMatchObject({ code: 'invalid', message: 'Give a reason for the change.' });
    await expect(
      setWellExclusion(await makeActor(['approver']), plateId, {
        wellIds: [well!.id],
        excluded: true,
        reason: 'x',
      }),
    ).rejects.toMatchObject({ code: 'forbidden' });
    expect(await Well.count({ where: { plateId, excluded: true } })).toBe(0);
  });

  test('a stale version is refused with a clear message', async () => {
    const [well] = await listPlateWells(biologist, plateId);
    await expect(
      setWellExclusion(biologist, plateId, {
        wellIds: [well!.id],
        excluded: true,
        reason: 'x',
        expectedVersion: 99,
      }),
    ).rejects.toMatchObject({
      code: 'conflict',
      message: 'Plate NAV-P01 was changed by someone else meanwhile; reload to see the change.',
    });
  });

  test('switching a fit to the four-parameter model is stored and audited', async () => {
    const fit = await fitOf('GW-0002');
    await setFitModel(biologist, plateId, {
      compoundId: fit.compoundId,
      targetId: fit.targetId,
      model: 'hill4',
    });
    await fitsCurrent(plateId);
    const refitted = await fitOf('GW-0002');
    expect(refitted.model).toBe('hill4');
    expect(refitted.bottom).not.toBe(fit.bottom); // the four-parameter fit frees the bottom plateau
    expect((await fitOf('GW-0001')).model).toBe('hill2');
    expect(await AuditEvent.count({ where: { action: 'change_fit_model', entityId: plateId } })).toBe(1);
  });

  test('an approved plate refuses exclusions in the service and any change in the database', async () => {
    // Approval itself belongs to the sign-off workflow; here the state is set directly to test the lock.
    await db().query("update plates set state = 'approved' where id = :plateId", {
      replacements: { plateId },
    });
    const [well] = await listPlateWells(biologist, plateId);
    await expect(
      setWellExclusion(biologist, plateId, { wellIds: [well!.id], excluded: true, reason: 'x' }),
    ).rejects.toMatchObject({ code: 'locked' });
    await expect(
      db().query('update wells set excluded = true, exclusion_reason = :r where id = :id', {
        replacements: { r: 'x', id: well!.id },
      }),
    ).rejects.toThrow(/approved and locked/);
    await expect(
      db().query('delete from fits where plate_id = :plateId', { replacements: { plateId } }),
    ).rejects.toThrow(/approved and locked/);
    await expect(
      db().query("update plates set label = 'renamed' where id = :plateId", { replacements: { plateId } }),
    ).rejects.toThrow(/approved and locked/);
    const [row] = await db().query<{ label: string }>('select label from plates where id = :plateId', {
      type: QueryTypes.SELECT,
      replacements: { plateId },
    });
    expect(row!.label).toBe('NAV-P01');
    expect((await Plate.findByPk(plateId))!.state).toBe('approved');
  });
});
