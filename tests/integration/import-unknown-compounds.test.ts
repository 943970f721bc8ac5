// Compound identifiers of a file that the registry lacks (issue 18): registered from the import's check
// step in one step (with an optional batch) or mapped to registered compounds as aliases that every later
// import reads; an import by someone who may not register them waits as a draft, the people who may are
// told by e-mail (outbox rows, delivered to the fake SMTP server) and in the app, and the owner resumes it.
// The files are the demo Kv7.2 export (seeders/data/demo-plates) with three identifiers renamed.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { resolveUnknownCompounds } from '@/lib/compounds/from-import';
import {
  discardWaitingImport,
  holdImportForCompounds,
  listWaitingImports,
  resumeWaitingImport,
} from '@/lib/compounds/waiting-imports';
import { db } from '@/lib/db';
import { deliverDueMail } from '@/lib/mail/deliver';
import { removeExpiredDrafts } from '@/lib/plates/import-drafts';
import { commitImport, inspectUpload, previewImport } from '@/lib/plates/import-service';
import { MailMessage, User } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { demoFile, makeDemoScreens } from '../support/demo-scenario';
import { fakeSmtpSettings, waitForMessages } from '../support/fake-smtp';

const APP_URL = process.env.APP_URL ?? 'http://127.0.0.1:4310';
const rows = async <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  db().query<T>(sql, { type: QueryTypes.SELECT, replacements });
const count = async (table: string) =>
  (await rows<{ n: number }>(`select count(*)::int as n from ${table}`))[0]!.n;
/** How many rows each table the registration writes holds, to prove a refusal wrote nothing. */
const written = async () => ({
  compounds: await count('compounds'),
  batches: await count('batches'),
  aliases: await count('compound_aliases'),
  audit: await count('audit_events'),
  mail: await count('mail_outbox'),
});

/**
 * The demo Kv7.2 export with GW-0003 written "XR 551" (not a valid identifier: only an alias can take
 * it) and GW-0006, GW-0009 renamed to the new NEW-7001, NEW-7002; `variant` changes one current so that
 * the bytes differ from the first file's.
 */
function renamedExport(variant = 0): Uint8Array {
  const text = new TextDecoder().decode(demoFile('kv-96-plate-01.csv').bytes);
  let changed = text
    .replaceAll(',GW-0003,', ',XR 551,')
    .replaceAll(',GW-0006,', ',NEW-7001,')
    .replaceAll(',GW-0009,', ',NEW-7002,');
  if (variant)
    changed = changed.replace('A01,VEH,DMSO,,Kv7.2,905.9,', `A01,VEH,DMSO,,Kv7.2,${905 + variant},`);
  if (changed === text) throw new Error('the demo export no longer holds the identifiers this test renames');
  return new TextEncoder().encode(changed);
}

const UNKNOWN = ['NEW-7001', 'NEW-7002', 'XR 551'];

afterAll(() => db().close());

describe('compounds a file names that the registry lacks', () => {
  let admin: Actor;
  let chemist: Actor;
  let biologist: Actor;
  let screenId: string;

  beforeEach(async () => {
    await resetDatabase();
    admin = await makeActor(['admin'], 'admin-unknown@example.org');
    chemist = await makeActor(['chemist'], 'chemist-unknown@example.org');
    biologist = await makeActor(['biologist'], 'biologist-unknown@example.org');
    screenId = (await makeDemoScreens(admin, chemist))['Kv7.2']!;
  });

  /** Reads a renamed export as `actor` and checks it; returns the draft and the choice the wizard sends. */
  async function readAndCheck(actor: Actor, variant = 0) {
    const name = `kv-renamed-${variant}.csv`;
    const inspection = await inspectUpload(actor, {
      screenId,
      bytes: renamedExport(variant),
      filename: name,
      mediaType: 'text/csv',
    });
    const sheet = inspection.sheets[0]!;
    const choice = { draftId: inspection.draftId!, sheet: sheet.name, mapping: sheet.guess.mapping };
    return { choice, preview: await previewImport(actor, choice) };
  }

  const compoundOfWells = (plateId: string) =>
    rows<{ identifier: string; wells: number }>(
      `select c.identifier, count(*)::int as wells from wells w join compounds c on c.id = w.compound_id
        where w.plate_id = :plateId group by c.identifier order by c.identifier`,
      { plateId },
    );

  test('the check lists the unknown identifiers and the commit is refused until they are registered', async () => {
    const both = await makeActor(['biologist', 'chemist']);
    const { choice, preview } = await readAndCheck(both);
    expect(preview.ok).toBe(false);
    expect(preview.unknownCompounds.map((c) => c.identifier).sort()).toEqual(UNKNOWN);
    await expect(commitImport(both, { ...choice, label: 'KV-R1' })).rejects.toMatchObject({
      code: 'invalid',
    });
  });

  test('registers all at once (one with a batch) and aliases one; the check passes and the plate stores', async () => {
    const both = await makeActor(['biologist', 'chemist']);
    const { choice } = await readAndCheck(both);
    const before = await written();
    const result = await resolveUnknownCompounds(both, {
      draftId: choice.draftId,
      register: [
        { identifier: 'NEW-7001', lot: 'L-0001' },
        { identifier: 'NEW-7002', lot: '' },
      ],
      aliases: [{ alias: 'XR 551', compoundIdentifier: 'GW-0003' }],
    });
    expect(result).toEqual({
      registered: [
        { identifier: 'NEW-7001', lot: 'L-0001' },
        { identifier: 'NEW-7002', lot: null },
      ],
      aliased: [{ alias: 'XR 551', compoundIdentifier: 'GW-0003' }],
      readyDrafts: [],
    });
    expect(await written()).toEqual({
      compounds: before.compounds + 2,
      batches: before.batches + 1,
      aliases: before.aliases + 1,
      audit: before.audit + 4, // two compounds, one batch, one alias
      mail: before.mail,
    });
    expect(
      await rows(
        `select c.identifier, b.lot from compounds c left join batches b on b.compound_id = c.id
          where c.identifier like 'NEW-%' order by c.identifier`,
      ),
    ).toEqual([
      { identifier: 'NEW-7001', lot: 'L-0001' },
      { identifier: 'NEW-7002', lot: null },
    ]);
    const aliasAudit = await rows<{ actor_id: string; after: Record<string, unknown> }>(
      "select actor_id, after from audit_events where entity_type = 'compound_alias'",
    );
    expect(aliasAudit).toHaveLength(1);
    expect(aliasAudit[0]).toMatchObject({
      actor_id: both.id,
      after: { alias: 'XR 551', compoundIdentifier: 'GW-0003', draftId: choice.draftId },
    });

    const again = await previewImport(both, choice);
    expect(again.unknownCompounds).toEqual([]);
    expect(again.ok).toBe(true);
    const { plateId } = await commitImport(both, { ...choice, label: 'KV-R1' });
    // The demo plate holds 16 wells of each test compound (seeders/data/demo-plates/kv-96-plate-01.csv).
    expect(await compoundOfWells(plateId)).toEqual([
      { identifier: 'GW-0001', wells: 16 },
      { identifier: 'GW-0003', wells: 16 },
      { identifier: 'GW-0012', wells: 16 },
      { identifier: 'NEW-7001', wells: 16 },
      { identifier: 'NEW-7002', wells: 16 },
    ]);
  });

  test('the next file that uses the alias needs nothing: it checks clean and stores on the aliased compound', async () => {
    await resolveUnknownCompounds(chemist, {
      register: [{ identifier: 'NEW-7001' }, { identifier: 'NEW-7002' }],
      aliases: [{ alias: 'xr   551', compoundIdentifier: 'gw-0003' }],
    });
    expect(await rows('select alias from compound_aliases')).toEqual([{ alias: 'xr 551' }]);
    const { choice, preview } = await readAndCheck(biologist, 1);
    expect(preview.unknownCompounds).toEqual([]);
    expect(preview.ok).toBe(true);
    const { plateId } = await commitImport(biologist, { ...choice, label: 'KV-R2' });
    expect((await compoundOfWells(plateId)).find((c) => c.identifier === 'GW-0003')).toEqual({
      identifier: 'GW-0003',
      wells: 16,
    });
  });

  test('refusals write nothing, with messages that name the problem', async () => {
    const before = await written();
    await expect(
      resolveUnknownCompounds(biologist, { register: [{ identifier: 'NEW-7001' }] }),
    ).rejects.toMatchObject({ code: 'forbidden', message: 'This needs the chemist or admin role.' });
    await expect(
      resolveUnknownCompounds(chemist, {
        register: [{ identifier: 'NEW-7001', lot: 'L-1' }, { identifier: 'XR 551' }],
      }),
    ).rejects.toMatchObject({
      code: 'invalid',
      message:
        'XR 551 cannot be registered as written (use letters, digits, dot, dash or underscore, starting with a letter or digit); map it to a registered compound as an alias instead.',
    });
    await expect(
      resolveUnknownCompounds(chemist, {
        register: [{ identifier: 'NEW-7001' }, { identifier: 'gw-0001' }],
        aliases: [{ alias: 'XR 551', compoundIdentifier: 'GW-9999' }],
      }),
    ).rejects.toMatchObject({
      code: 'invalid',
      message:
        'gw-0001 is already registered. GW-9999 is not a registered compound; map XR 551 to one that is.',
    });
    expect(await written()).toEqual(before);

    await resolveUnknownCompounds(chemist, { aliases: [{ alias: 'XR 551', compoundIdentifier: 'GW-0003' }] });
    await expect(
      resolveUnknownCompounds(admin, { aliases: [{ alias: 'xr 551', compoundIdentifier: 'GW-0001' }] }),
    ).rejects.toMatchObject({ message: 'xr 551 is already an alias of GW-0003.' });
    await expect(
      resolveUnknownCompounds(admin, { register: [{ identifier: 'XR-551' }, { identifier: 'xr-551' }] }),
    ).rejects.toMatchObject({ message: 'xr-551 is named twice; choose one thing to do with it.' });
  });

  test('a biologist keeps the import waiting; the people who may register are told by e-mail and see it listed', async () => {
    const disabled = await makeActor(['chemist'], 'chemist-disabled@example.org');
    await User.update({ disabledAt: new Date() }, { where: { id: disabled.id } });
    const { choice } = await readAndCheck(biologist);

    const held = await holdImportForCompounds(biologist, { ...choice, label: 'KV-WAIT' });
    expect({ ...held, waitingFor: [...held.waitingFor].sort() }).toEqual({
      waitingFor: UNKNOWN,
      notified: ['admin-unknown@example.org', 'chemist-unknown@example.org'],
    });
    const mail = await MailMessage.findAll({
      where: { kind: 'import_waiting_for_compounds' },
      order: [['toAddress', 'ASC']],
      raw: true,
    });
    expect(mail.map((m) => [m.toAddress, m.recipientId, m.state])).toEqual([
      ['admin-unknown@example.org', admin.id, 'queued'],
      ['chemist-unknown@example.org', chemist.id, 'queued'],
    ]);
    expect(mail[0]!.subject).toBe('Gatewell: an import waits for 3 compounds to be registered');
    expect(mail[0]!.bodyText).toContain(
      'Test biologist is importing kv-renamed-0.csv (Potassium counter-screen). The file names 3 compounds the registry does not know:',
    );
    for (const id of UNKNOWN) expect(mail[0]!.bodyText).toContain(`  - ${id}\n`);
    expect(mail[0]!.bodyText).toContain(
      `Open the imports waiting for compounds: ${APP_URL}/compounds#waiting-imports`,
    );
    expect(
      await rows(
        "select actor_id, entity_id from audit_events where action = 'wait' and entity_type = 'import_draft'",
      ),
    ).toEqual([{ actor_id: biologist.id, entity_id: choice.draftId }]);

    // Listed for those who may register and for the owner; not for another biologist.
    const forChemist = await listWaitingImports(chemist);
    expect(
      forChemist.map((w) => [w.id, w.filename, w.ownerName, w.ownedByActor, [...w.missing].sort()]),
    ).toEqual([[choice.draftId, 'kv-renamed-0.csv', 'Test biologist', false, UNKNOWN]]);
    expect((await listWaitingImports(biologist)).map((w) => [w.id, w.ownedByActor])).toEqual([
      [choice.draftId, true],
    ]);
    expect(await listWaitingImports(await makeActor(['biologist']))).toEqual([]);

    // A waiting draft outlives its expiry: the sweep keeps it and its owner can still resume it.
    await db().query(
      "update import_drafts set expires_at = created_at + interval '1 second' where id = :id",
      {
        replacements: { id: choice.draftId },
      },
    );
    await removeExpiredDrafts();
    expect((await resumeWaitingImport(biologist, choice.draftId)).choice.label).toBe('KV-WAIT');

    // The sender delivers the notices to the fake SMTP server.
    const report = await deliverDueMail({ smtp: fakeSmtpSettings() });
    expect(report.failed).toBe(0);
    const [kept] = await waitForMessages(
      (m) => m.envelope.to.includes('chemist-unknown@example.org') && m.text.includes('kv-renamed-0.csv'),
    );
    expect(kept!.subject).toBe('Gatewell: an import waits for 3 compounds to be registered');
    expect(kept!.text).toContain('XR 551');
  });

  test('once a chemist registers and maps them, the owner is told, resumes the import and stores the plate', async () => {
    const { choice } = await readAndCheck(biologist);
    await holdImportForCompounds(biologist, { ...choice, label: 'KV-WAIT' });

    const partly = await resolveUnknownCompounds(chemist, { register: [{ identifier: 'NEW-7001' }] });
    expect(partly.readyDrafts).toEqual([]);
    expect((await listWaitingImports(chemist))[0]!.missing.sort()).toEqual(['NEW-7002', 'XR 551']);

    const rest = await resolveUnknownCompounds(chemist, {
      draftId: choice.draftId,
      register: [{ identifier: 'NEW-7002', lot: 'B-2' }],
      aliases: [{ alias: 'XR 551', compoundIdentifier: 'GW-0003' }],
    });
    expect(rest.readyDrafts).toEqual([choice.draftId]);
    const ready = await MailMessage.findAll({ where: { kind: 'import_compounds_ready' }, raw: true });
    expect(ready.map((m) => [m.toAddress, m.subject])).toEqual([
      ['biologist-unknown@example.org', 'Gatewell: the compounds of kv-renamed-0.csv are registered'],
    ]);
    expect(ready[0]!.bodyText).toContain(
      `Resume the import: ${APP_URL}/plates/import?resume=${choice.draftId}`,
    );
    expect((await listWaitingImports(biologist))[0]!.missing).toEqual([]);

    const resumed = await resumeWaitingImport(biologist, choice.draftId);
    expect(resumed.choice).toMatchObject({ sheet: choice.sheet, label: 'KV-WAIT' });
    const preview = await previewImport(biologist, {
      draftId: resumed.draftId,
      sheet: resumed.choice.sheet,
      mapping: resumed.choice.mapping,
    });
    expect(preview.ok).toBe(true);
    const { plateId } = await commitImport(biologist, {
      draftId: resumed.draftId,
      sheet: resumed.choice.sheet,
      mapping: resumed.choice.mapping,
      label: resumed.choice.label,
    });
    expect((await compoundOfWells(plateId)).map((c) => c.identifier)).toEqual([
      'GW-0001',
      'GW-0003',
      'GW-0012',
      'NEW-7001',
      'NEW-7002',
    ]);
    expect(await listWaitingImports(biologist)).toEqual([]);
    expect(await listWaitingImports(chemist)).toEqual([]);
  });

  test('waiting is refused when nothing is missing or the person may not import; only the owner discards', async () => {
    await resolveUnknownCompounds(chemist, {
      register: [{ identifier: 'NEW-7001' }, { identifier: 'NEW-7002' }],
      aliases: [{ alias: 'XR 551', compoundIdentifier: 'GW-0003' }],
    });
    const clean = await readAndCheck(biologist);
    await expect(holdImportForCompounds(biologist, { ...clean.choice, label: 'X' })).rejects.toMatchObject({
      code: 'invalid',
      message: 'Every compound of this file is registered: store the plate instead of waiting.',
    });
    await expect(holdImportForCompounds(chemist, { ...clean.choice, label: 'X' })).rejects.toMatchObject({
      code: 'forbidden',
    });
    expect(await count("mail_outbox where kind = 'import_waiting_for_compounds'")).toBe(0);

    await db().query('delete from compound_aliases');
    const { choice } = await readAndCheck(biologist, 2);
    await holdImportForCompounds(biologist, { ...choice, label: 'KV-W2' });
    const other = await makeActor(['biologist']);
    await expect(discardWaitingImport(other, choice.draftId)).rejects.toMatchObject({
      code: 'not_found',
      message: 'No such import draft: read the file again.',
    });
    await discardWaitingImport(biologist, choice.draftId);
    expect(await count('import_drafts where waiting_since is not null')).toBe(0);
    expect(
      await rows(
        "select actor_id from audit_events where action = 'discard' and entity_type = 'import_draft'",
      ),
    ).toEqual([{ actor_id: biologist.id }]);
  });
});
