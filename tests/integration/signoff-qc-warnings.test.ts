import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { deliverDueMail } from '@/lib/mail/deliver';
import { commitImport, inspectUpload } from '@/lib/plates/import-service';
import { signoffPanel } from '@/lib/signoff/panel';
import { plateContentSha256 } from '@/lib/signoff/plate-content';
import { signPlateStep } from '@/lib/signoff/service';
import { AuditEvent, MailMessage, Signature, SignoffEvent } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { demoFile, makeDemoScreens } from '../support/demo-scenario';
import { fakeSmtpSettings, waitForMessages } from '../support/fake-smtp';
import { fitsCurrent } from '../support/jobs';
import { writtenRows } from '../support/signoff-scenario';

// A plate whose QC is doubtful carries that to the decision: the sign-off panel says so before anyone
// signs, the signer must acknowledge it, the acknowledgement is kept with the signature and the next
// person reads it in the notice. The plate is the demo potassium export without its series-resistance
// column (so the series-resistance rule is not applied), in a screen whose Z′ limit is raised above
// the plate's Z′.

/** The rule's message, as written in tests/integration/plate-import-whole-file.test.ts for the same file. */
const SERIES_RULE =
  'The series resistance rule (1 to 25 MΩ) was not applied: no well has a series resistance. The other QC rules, Z′ and the fits still run.';
/** Z′ can be at most 1, so a limit of 0.99 puts any real plate below it (Zhang et al. 1999, J Biomol Screen 4:67). */
const HIGH_LIMIT = 0.99;

function kvCsvWithoutSeriesResistance(): Uint8Array {
  const lines = new TextDecoder()
    .decode(demoFile('kv-96-plate-01.csv').bytes)
    .replace(/^\ufeff/, '')
    .trimEnd()
    .split(/\r?\n/);
  const drop = lines[0]!.split(',').indexOf('Rs (MΩ)');
  expect(drop).toBeGreaterThan(0);
  const kept = lines.map((line) =>
    line
      .split(',')
      .filter((_, i) => i !== drop)
      .join(','),
  );
  return new TextEncoder().encode(`${kept.join('\n')}\n`);
}

describe('plate QC carried to the sign-off decision', () => {
  let chemist: Actor;
  let biologist: Actor;
  let plateId: string;
  let screenId: string;

  beforeEach(async () => {
    await resetDatabase();
    const admin = await makeActor(['admin']);
    chemist = await makeActor(['chemist']);
    const screens = await makeDemoScreens(admin, chemist);
    biologist = await makeActor(['biologist']);
    screenId = screens['Kv7.2']!;
    const inspection = await inspectUpload(biologist, {
      screenId,
      bytes: kvCsvWithoutSeriesResistance(),
      filename: 'kv-no-rs.csv',
      mediaType: 'text/csv',
    });
    const sheet = inspection.sheets[0]!;
    ({ plateId } = await commitImport(biologist, {
      draftId: inspection.draftId!,
      sheet: sheet.name,
      mapping: sheet.guess.mapping,
      label: 'KV-QC',
    }));
    await fitsCurrent(plateId);
  });
  afterAll(() => db().close());

  const raiseZPrimeLimit = () =>
    db().query('update screens set z_prime_min = :limit where id = :screenId', {
      replacements: { limit: HIGH_LIMIT, screenId },
    });

  test('the panel lists the warnings before anyone signs, for signers and onlookers alike', async () => {
    const before = await signoffPanel(chemist, plateId);
    expect(before.qcWarnings.map((w) => [w.code, w.key, w.message])).toEqual([
      ['qc_rule_not_applied', 'qc_rule_not_applied:series_resistance', SERIES_RULE],
    ]);
    await raiseZPrimeLimit();
    const after = await signoffPanel(biologist, plateId); // the importer: may not verify, still reads them
    expect(after.choices).toEqual([]);
    expect(after.qcWarnings.map((w) => w.code)).toEqual(['z_prime_below_limit', 'qc_rule_not_applied']);
    expect(after.qcWarnings[0]!.message).toMatch(
      /^Kv7\.2: Z′ 0\.\d\d is below the screen's limit of 0\.99\.$/,
    );
    expect(after.qcWarningKeys).toBe(
      after.qcWarnings
        .map((w) => w.key)
        .sort()
        .join(' '),
    );
  });

  test('a signature without the acknowledgement, or over other warnings than shown, is refused and writes nothing', async () => {
    await raiseZPrimeLimit();
    const before = await writtenRows(plateId);
    await expect(
      signPlateStep(chemist, plateId, { action: 'verify', password: 'test-password-123' }),
    ).rejects.toMatchObject({
      code: 'invalid',
      message: 'Plate KV-QC has 2 QC warnings: tick that you read them before you sign. Nothing was signed.',
      details: {
        fieldErrors: {
          acknowledgeQcWarnings: [
            'Plate KV-QC has 2 QC warnings: tick that you read them before you sign. Nothing was signed.',
          ],
        },
      },
    });
    // The form showed only the rule's warning (the page was opened before the limit was raised).
    await expect(
      signPlateStep(chemist, plateId, {
        action: 'verify',
        password: 'test-password-123',
        acknowledgeQcWarnings: 'yes',
        qcWarningsShown: 'qc_rule_not_applied:series_resistance',
      }),
    ).rejects.toMatchObject({
      code: 'conflict',
      message:
        'The QC warnings of plate KV-QC changed after you opened it; reload the page and read them before you sign. Nothing was signed.',
    });
    expect(await writtenRows(plateId)).toEqual(before);
  });

  test('the acknowledged warnings are stored with the signature, audited, and told in the next notice by e-mail', async () => {
    const plain = await signPlateStep(chemist, plateId, {
      action: 'verify',
      password: 'test-password-123',
      acknowledgeQcWarnings: 'yes',
      qcWarningsShown: 'qc_rule_not_applied:series_resistance',
    });
    expect(plain.qcWarnings.map((w) => w.code)).toEqual(['qc_rule_not_applied']);

    await raiseZPrimeLimit();
    const panel = await signoffPanel(biologist, plateId);
    const submitter = await makeActor(['biologist']);
    const approver = await makeActor(['approver']);
    const result = await signPlateStep(submitter, plateId, {
      action: 'submit',
      password: 'test-password-123',
      acknowledgeQcWarnings: 'yes',
      qcWarningsShown: panel.qcWarningKeys,
    });
    const event = await SignoffEvent.findByPk(result.signoffEventId);
    expect(event!.qcWarnings).toEqual(
      panel.qcWarnings.map(({ code, key, message }) => ({ code, key, message })),
    );
    expect(event!.qcWarnings.map((w) => w.code)).toEqual(['z_prime_below_limit', 'qc_rule_not_applied']);
    const audit = await AuditEvent.findOne({ where: { action: 'submit', entityId: plateId } });
    expect(audit!.after).toMatchObject({ qcWarningsAcknowledged: panel.qcWarnings.map((w) => w.message) });

    // The signed content is the plate's data alone, as before: the warnings and their acknowledgement
    // are kept beside it, so the verifier's signature still matches the data, and so does the submitter's.
    const signatures = await Signature.findAll({
      where: { entityId: plateId },
      order: [['signedAt', 'ASC']],
    });
    expect(signatures.map((s) => s.contentSha256)).toEqual([
      await plateContentSha256(plateId),
      await plateContentSha256(plateId),
    ]);

    // The approvers' notice says what the submitter acknowledged, and it arrives over SMTP.
    const notices = await MailMessage.findAll({ where: { plateId, kind: 'plate_submitted' } });
    expect(notices.map((m) => m.toAddress)).toEqual([approver.email]);
    const notice = notices[0];
    const expectedLines = [
      `QC warnings on this plate, which ${submitter.name} acknowledged when signing:`,
      `- ${panel.qcWarnings[0]!.message}`,
      `- ${SERIES_RULE}`,
    ].join('\n');
    expect(notice!.bodyText).toContain(expectedLines);
    await deliverDueMail({ smtp: fakeSmtpSettings() });
    const [kept] = await waitForMessages(
      (m) => m.envelope.to.includes(approver.email) && m.subject.includes('submitted for approval'),
    );
    expect(kept!.text).toContain(expectedLines);
  });

  test('the import notice to chemists names the warnings found at import', async () => {
    const [notice] = await MailMessage.findAll({ where: { plateId, kind: 'plate_imported' } });
    expect(notice!.bodyText).toContain(
      `QC warnings on this plate (the sign-off panel shows them before anyone signs):\n- ${SERIES_RULE}`,
    );
  });
});
