import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { listPlates } from '@/lib/plates/list';
import { signPlateStep } from '@/lib/signoff/service';
import { Plate } from '@/models';
import { makeActor } from '../support/actors';
import { asSchemaOwner, resetDatabase } from '../support/database';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';

describe('segregation of duties, in the service and in the database', () => {
  let cast: SignoffCast;
  beforeEach(async () => {
    await resetDatabase();
    cast = await signoffCast();
  });
  afterAll(() => db().close());

  const sign = (actor: Actor, action: 'verify' | 'submit' | 'approve' | 'reject', comment = '') =>
    signPlateStep(actor, cast.plateId, { action, password: PASSWORD, comment });
  const toSubmitted = async (verifier = cast.chemist, submitter = cast.biologist) => {
    await sign(verifier, 'verify');
    await sign(submitter, 'submit');
  };
  const setImporter = (userId: string) =>
    db().query('update plates set imported_by = :userId where id = :plateId', {
      replacements: { userId, plateId: cast.plateId },
    });

  test('the importer may not verify the compound map, even holding the chemist role', async () => {
    const both = await makeActor(['chemist', 'biologist']);
    await setImporter(both.id);
    await expect(sign(both, 'verify')).rejects.toMatchObject({
      code: 'forbidden',
      message: 'You imported this plate, so another chemist verifies its compound map.',
    });
    expect((await Plate.findByPk(cast.plateId))!.state).toBe('imported');
  });

  test.each([
    ['imported', 'You imported this plate, so another approver decides on it.'],
    ['verified', 'You verified this plate’s compound map, so another approver decides on it.'],
    ['submitted', 'You submitted this plate, so another approver decides on it.'],
  ] as const)('someone who %s the plate may neither approve nor return it', async (duty, message) => {
    const who = await makeActor(['chemist', 'biologist', 'approver']);
    if (duty === 'imported') await setImporter(who.id);
    await toSubmitted(duty === 'verified' ? who : cast.chemist, duty === 'submitted' ? who : cast.biologist);
    await expect(sign(who, 'approve')).rejects.toMatchObject({ code: 'forbidden', message });
    await expect(sign(who, 'reject', 'not mine to decide')).rejects.toMatchObject({
      code: 'forbidden',
      message,
    });
    expect((await Plate.findByPk(cast.plateId))!.state).toBe('submitted');
  });

  test.each([
    ['plates_verifier_independent', 'verified_by = imported_by'],
    ['plates_decider_independent', 'decided_by = imported_by'],
    ['plates_decider_independent', 'decided_by = verified_by'],
    ['plates_decider_not_submitter', 'decided_by = submitted_by'],
  ])('the database refuses a direct update that breaks %s (%s)', async (constraint, assignment) => {
    await toSubmitted(cast.chemist, await makeActor(['biologist'])); // importer, verifier and submitter: three people
    await expect(
      db().query(`update plates set ${assignment} where id = :plateId`, {
        replacements: { plateId: cast.plateId },
      }),
    ).rejects.toMatchObject({
      parent: { code: '23514', constraint },
    });
    expect((await Plate.findByPk(cast.plateId))!.decidedBy).toBeNull();
  });

  test('signatures and sign-off events are append-only in the database', async () => {
    await sign(cast.chemist, 'verify');
    const sql = [
      "update signatures set meaning = 'changed'",
      'delete from signatures',
      "update signoff_events set to_state = 'submitted'",
      'delete from signoff_events',
    ];
    for (const statement of sql) {
      // The app's role is granted no change to them; their owner meets the trigger.
      await expect(db().query(statement)).rejects.toThrow(
        /permission denied for table (signatures|signoff_events)/,
      );
      await expect(asSchemaOwner((client) => client.query(statement))).rejects.toThrow(/append-only/);
    }
  });

  test('"My work" lists a plate only for people who may sign its next step', async () => {
    const chemistImporter = await makeActor(['chemist', 'biologist']);
    const approverImporter = await makeActor(['biologist', 'approver']);
    const waiting = async (actor: Actor) => (await listPlates(actor, { waitingFor: actor })).map((p) => p.id);
    expect(await waiting(cast.chemist)).toEqual([cast.plateId]);
    await setImporter(chemistImporter.id);
    expect(await waiting(chemistImporter)).toEqual([]);
    await setImporter(approverImporter.id);
    await toSubmitted(cast.chemist, approverImporter);
    expect(await waiting(cast.approver)).toEqual([cast.plateId]);
    expect(await waiting(approverImporter)).toEqual([]);
    expect(await waiting(cast.chemist)).toEqual([]);
    expect(await waiting(cast.admin)).toEqual([]);
  });
});
