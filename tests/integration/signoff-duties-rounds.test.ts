import pg from 'pg';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { signoffPanel } from '@/lib/signoff/panel';
import { signPlateStep } from '@/lib/signoff/service';
import { signoffRequestSchema } from '@/lib/validation/signoff';
import { Plate, Signature, SignoffEvent } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { PASSWORD, signoffCast, writtenRows, type SignoffCast } from '../support/signoff-scenario';

/** A connection of its own as the app's role (DATABASE_URL), for raw SQL the test interleaves by hand. */
async function appClient(): Promise<pg.Client> {
  const client = new pg.Client({
    connectionString: process.env.DATABASE_URL,
    application_name: 'gatewell-test-duties',
  });
  await client.connect();
  return client;
}

/** Waits until the backend `pid` waits for a lock: the interleaving the test forces has happened. */
async function waitUntilBlocked(watcher: pg.Client, pids: number[]): Promise<void> {
  for (;;) {
    const { rows } = await watcher.query<{ n: number }>(
      `select count(*)::int as n from pg_stat_activity where pid = any($1) and wait_event_type = 'Lock'`,
      [pids],
    );
    if (rows[0]!.n === pids.length) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** Waits until `count` backends of this database wait for a lock (requests whose backend we cannot name). */
async function waitForLockWaiters(watcher: pg.Client, count: number): Promise<void> {
  for (;;) {
    const { rows } = await watcher.query<{ n: number }>(
      `select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'`,
    );
    if (rows[0]!.n >= count) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** A signature row of `signerId` on the plate, as signRecord writes it, through a raw connection. */
async function insertSignature(client: pg.Client, signerId: string, plateId: string): Promise<string> {
  const { rows } = await client.query<{ id: string }>(
    `insert into signatures (signer_id, meaning, comment, entity_type, entity_id, content_sha256)
     values ($1, 'direct SQL', '', 'plate', $2, repeat('a', 64)) returning id`,
    [signerId, plateId],
  );
  return rows[0]!.id;
}

const insertEvent = (client: pg.Client, plateId: string, signatureId: string, from: string, to: string) =>
  client.query(
    'insert into signoff_events (plate_id, signature_id, from_state, to_state) values ($1, $2, $3, $4)',
    [plateId, signatureId, from, to],
  );

describe('segregation of duties on every step of a round, in the service, the database and under races', () => {
  let cast: SignoffCast;
  let both: Actor; // holds the chemist and biologist roles
  beforeEach(async () => {
    await resetDatabase();
    cast = await signoffCast();
    both = await makeActor(['chemist', 'biologist']);
  });
  afterAll(() => db().close());

  const sign = (actor: Actor, action: 'verify' | 'submit' | 'approve' | 'reject' | 'rework', comment = '') =>
    signPlateStep(actor, cast.plateId, { action, password: PASSWORD, comment });

  test('whoever verified a plate may not submit it, whatever roles they hold; the refusal writes nothing', async () => {
    await sign(both, 'verify');
    const before = await writtenRows(cast.plateId);
    await expect(sign(both, 'submit')).rejects.toMatchObject({
      code: 'forbidden',
      message: 'You verified this plate’s compound map, so another biologist reviews and submits it.',
    });
    expect(await writtenRows(cast.plateId)).toEqual(before);
    expect(await Plate.findByPk(cast.plateId)).toMatchObject({ state: 'verified', submittedBy: null });
    // Nor does the panel offer it, and "My work" does not list it for them.
    const panel = await signoffPanel(both, cast.plateId);
    expect(panel.choices).toEqual([]);
    expect(panel.notYours).toBe(
      'You verified this plate’s compound map, so another biologist reviews and submits it.',
    );
    // Someone else submits it.
    await sign(cast.biologist, 'submit');
    expect((await Plate.findByPk(cast.plateId))!.submittedBy).toBe(cast.biologist.id);
  });

  test('each round is judged afresh: a duty of the last round does not bar another in the next', async () => {
    const all = await makeActor(['chemist', 'biologist', 'approver']);
    await sign(all, 'verify');
    await sign(cast.biologist, 'submit');
    await sign(cast.approver, 'reject', 'Re-check the vehicle wells.');
    await sign(cast.biologist, 'rework');
    // Round two: the first round's verifier submits, and the first round's decider verifies.
    const approverChemist = await makeActor(['chemist', 'approver']);
    await sign(approverChemist, 'verify');
    await sign(all, 'submit');
    await expect(sign(all, 'approve')).rejects.toMatchObject({
      code: 'forbidden',
      message: 'You submitted this plate, so another approver decides on it.',
    });
    await expect(sign(approverChemist, 'approve')).rejects.toMatchObject({
      code: 'forbidden',
      message: 'You verified this plate’s compound map, so another approver decides on it.',
    });
    await sign(cast.approver, 'approve');
    const events = await SignoffEvent.findAll({
      where: { plateId: cast.plateId },
      order: [
        ['round', 'ASC'],
        ['occurredAt', 'ASC'],
      ],
    });
    const signers = new Map(
      (await Signature.findAll({ where: { entityId: cast.plateId } })).map((s) => [s.id, s.signerId]),
    );
    expect(events.map((e) => [e.round, e.toState, signers.get(e.signatureId)])).toEqual([
      [0, 'verified', all.id],
      [0, 'submitted', cast.biologist.id],
      [0, 'rejected', cast.approver.id],
      [0, 'imported', cast.biologist.id],
      [1, 'verified', approverChemist.id],
      [1, 'submitted', all.id],
      [1, 'approved', cast.approver.id],
    ]);
  });

  test('the database refuses what the service would: a second duty of one signer in a round, by direct SQL', async () => {
    await sign(both, 'verify');
    const before = await writtenRows(cast.plateId);
    const client = await appClient();
    try {
      await client.query('begin');
      const signatureId = await insertSignature(client, both.id, cast.plateId);
      await expect(
        insertEvent(client, cast.plateId, signatureId, 'verified', 'submitted'),
      ).rejects.toMatchObject({ code: '23514', constraint: 'signoff_events_one_duty_per_round' });
      await client.query('rollback');
      // The plate row keeps the same rule.
      await expect(
        client.query('update plates set submitted_by = verified_by where id = $1', [cast.plateId]),
      ).rejects.toMatchObject({ code: '23514', constraint: 'plates_submitter_not_verifier' });
      // A signature of another plate (or none) cannot carry a step of this one.
      const other = await makeActor(['biologist']);
      await client.query('begin');
      const elsewhere = await client.query<{ id: string }>(
        `insert into signatures (signer_id, meaning, entity_type, entity_id, content_sha256)
         values ($1, 'elsewhere', 'plate', gen_random_uuid(), repeat('b', 64)) returning id`,
        [other.id],
      );
      await expect(
        insertEvent(client, cast.plateId, elsewhere.rows[0]!.id, 'verified', 'submitted'),
      ).rejects.toMatchObject({ code: '23514', constraint: 'signoff_events_signature_of_plate' });
      await client.query('rollback');
    } finally {
      await client.end();
    }
    expect(await writtenRows(cast.plateId)).toEqual(before);
    expect(await Plate.findByPk(cast.plateId)).toMatchObject({
      state: 'verified',
      verifiedBy: both.id,
      submittedBy: null,
    });
  });

  test('two sign-offs of one signer racing on one plate: the second waits for the first, then is refused', async () => {
    const first = await appClient();
    const second = await appClient();
    const watcher = await appClient();
    try {
      // First: the verify event is written and its transaction stays open (the trigger holds the plate row).
      await first.query('begin');
      const verifySignature = await insertSignature(first, both.id, cast.plateId);
      await insertEvent(first, cast.plateId, verifySignature, 'imported', 'verified');
      // Second, started while the first holds the row: its submit event must wait.
      const { rows } = await second.query<{ pid: number }>('select pg_backend_pid() as pid');
      await second.query('begin');
      const submitSignature = await insertSignature(second, both.id, cast.plateId);
      const submitting = insertEvent(second, cast.plateId, submitSignature, 'verified', 'submitted').then(
        () => 'written',
        (error: { code?: string; constraint?: string }) => error,
      );
      await waitUntilBlocked(watcher, [rows[0]!.pid]);
      await first.query('commit');
      expect(await submitting).toMatchObject({
        code: '23514',
        constraint: 'signoff_events_one_duty_per_round',
      });
      await second.query('rollback');
    } finally {
      await Promise.all([first.end(), second.end(), watcher.end()]);
    }
    const events = await SignoffEvent.findAll({ where: { plateId: cast.plateId } });
    expect(events.map((e) => e.toState)).toEqual(['verified']);
  });

  test('through the service, a verify and a submit of one person held at the plate row: only one lands', async () => {
    const holder = await appClient();
    const watcher = await appClient();
    let results: PromiseSettledResult<unknown>[];
    try {
      await holder.query('begin');
      await holder.query('select 1 from plates where id = $1 for update', [cast.plateId]);
      const verifying = sign(both, 'verify');
      await waitForLockWaiters(watcher, 1);
      const submitting = sign(both, 'submit');
      await waitForLockWaiters(watcher, 2);
      await holder.query('commit');
      results = await Promise.allSettled([verifying, submitting]);
    } finally {
      await Promise.all([holder.end(), watcher.end()]);
    }
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    expect(results.filter((r) => r.status === 'rejected')).toHaveLength(1);
    expect(await Plate.findByPk(cast.plateId)).toMatchObject({
      state: 'verified',
      verifiedBy: both.id,
      submittedBy: null,
    });
    expect(await SignoffEvent.count({ where: { plateId: cast.plateId } })).toBe(1);
    expect(await Signature.count({ where: { entityId: cast.plateId } })).toBe(1);
  });

  test('an admin sees who signed what, but signs for nobody else: the signer is always the signed-in person', async () => {
    await sign(cast.chemist, 'verify');
    const panel = await signoffPanel(cast.admin, cast.plateId);
    expect(panel.signers.verifiedBy).toBe(cast.chemist.name);
    expect(panel.lastSignature).toMatchObject({ signerName: cast.chemist.name });
    expect(panel.choices).toEqual([]);

    // No request names a signer: a field claiming one is dropped by the schema…
    const parsed = signoffRequestSchema.parse({
      action: 'submit',
      password: PASSWORD,
      signerId: cast.biologist.id,
      signer: cast.biologist.id,
      actorId: cast.biologist.id,
    });
    expect(Object.keys(parsed).sort()).toEqual(
      ['acknowledgeQcWarnings', 'action', 'comment', 'password'].sort(),
    );
    // …so an admin naming the biologist (with the biologist's password) is refused as the admin,
    const before = await writtenRows(cast.plateId);
    await expect(
      signPlateStep(cast.admin, cast.plateId, {
        action: 'submit',
        password: PASSWORD,
        signerId: cast.biologist.id,
      } as Parameters<typeof signPlateStep>[2]),
    ).rejects.toMatchObject({ code: 'forbidden' });
    expect(await writtenRows(cast.plateId)).toEqual(before);
    // …and someone who may sign, naming another, signs as themselves.
    const result = await signPlateStep(cast.biologist, cast.plateId, {
      action: 'submit',
      password: PASSWORD,
      signerId: cast.admin.id,
    } as Parameters<typeof signPlateStep>[2]);
    expect((await Signature.findByPk(result.signatureId))!.signerId).toBe(cast.biologist.id);
  });
});
