import { expect, test } from '@playwright/test';
import { waitForMessages } from '../../support/fake-smtp';
import { queryOne, screenshot } from '../support';
import { PEOPLE, signedIn } from '../signoff-support';
import { importThroughApi, mailServer, potassiumScreenId } from './fault-support';

// The mail server is down while a chemist signs a step: the step is recorded at once and its notice
// waits in the outbox with the failed attempt; an admin's "Send waiting mail now" tries it again at once,
// without waiting for the sender's own retry (lib/mail/deliver.ts: a minute after the first attempt, then
// two, four …, covered in tests/integration/signoff-mail.test.ts), and once the server is back the same
// button delivers it. Nobody restarts anything else.
const LABEL = 'KV-MAIL-DOWN';
const SUBJECT = `Gatewell: plate ${LABEL} compound map verified: ready to review and submit`;

interface OutboxRow {
  state: string;
  attempts: number;
  lastError: string | null;
}

const notice = (plateId: string) =>
  queryOne<OutboxRow>(
    `select state, attempts, last_error as "lastError" from mail_outbox where plate_id = $1 and kind = 'plate_verified' and to_address = $2`,
    [plateId, PEOPLE.biologist.email],
  );

test('with the mail server down a sign-off step is recorded and its notice waits in the outbox, then goes out once the server is back', async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(300_000);
  const biologist = await signedIn(browser, 'biologist');
  const imported = await importThroughApi(biologist.request, baseURL!, await potassiumScreenId(), LABEL);
  expect(imported.status, JSON.stringify(imported.body)).toBe(201);
  const plateId = String(imported.body.plateId);
  // The chemists' import notice goes out while the server is still up, so that only the step's notice waits.
  await waitForMessages(
    (m) => m.subject === `Gatewell: plate ${LABEL} imported: compound map to verify`,
    1,
    60_000,
  );

  mailServer('stop');
  try {
    const chemist = await signedIn(browser, 'chemist');
    await chemist.goto(`/plates/${plateId}/history`);
    await chemist.getByLabel('Your password, to sign').fill(PEOPLE.chemist.password);
    await chemist.getByRole('button', { name: 'Sign: Verify the compound map' }).click();
    await expect(
      chemist.getByRole('status').filter({ hasText: `Signed. Plate ${LABEL} is now verified` }),
    ).toBeVisible();

    // The transition is recorded whatever the mail server does: state, signature and history.
    expect(await queryOne('select state, version from plates where id = $1', [plateId])).toEqual({
      state: 'verified',
      version: 2,
    });
    await chemist.reload();
    const history = chemist.getByRole('region', { name: 'History' });
    await expect(history.getByText('Compound map verified', { exact: true })).toBeVisible();
    await expect(history.getByText('State imported → verified, version 2')).toBeVisible();

    // The pass that runs right after the step fails to connect: the notice stays queued with its error.
    await expect
      .poll(async () => (await notice(plateId))?.attempts, { timeout: 60_000 })
      .toBeGreaterThanOrEqual(1);
    const waiting = (await notice(plateId))!;
    expect(waiting).toMatchObject({ state: 'queued', lastError: expect.stringMatching(/ECONNREFUSED/) });

    // The admin sees it in the outbox as retrying, with the attempt and the error.
    const admin = await signedIn(browser, 'admin');
    await admin.goto('/admin/outbox?state=queued');
    const row = admin
      .getByRole('row')
      .filter({ has: admin.getByRole('link', { name: SUBJECT }) })
      .filter({ hasText: PEOPLE.biologist.email });
    await expect(row).toContainText('Retrying');
    await expect(row).toContainText(`${waiting.attempts} of 8`);
    await expect(row).toContainText('ECONNREFUSED');
    await expect(row).toContainText('Next attempt');
    await screenshot(admin, 'fault-mail-down-outbox');

    // The admin need not wait for the retry: "Send waiting mail now" tries it at once (still down here).
    await admin.getByRole('button', { name: 'Send waiting mail now' }).click();
    await expect(
      admin
        .getByRole('status')
        .filter({ hasText: /it tried (one message|\d+ messages) waiting for a retry at once/ }),
    ).toBeVisible();
    await expect
      .poll(async () => (await notice(plateId))?.attempts, { timeout: 30_000 })
      .toBeGreaterThan(waiting.attempts);
    expect(await notice(plateId)).toMatchObject({
      state: 'queued',
      lastError: expect.stringMatching(/ECONNREFUSED/),
    });
  } finally {
    mailServer('start');
  }

  // Back up: the admin sends the waiting mail at once, and the notice reaches the biologist.
  const admin = await signedIn(browser, 'admin');
  await admin.goto('/admin/outbox?state=queued');
  await admin.getByRole('button', { name: 'Send waiting mail now' }).click();
  await expect(admin.getByRole('status').filter({ hasText: 'Delivery pass finished' })).toBeVisible();
  const [delivered] = await waitForMessages(
    (m) => m.subject === SUBJECT && m.envelope.to.includes(PEOPLE.biologist.email),
    1,
    60_000,
  );
  expect(delivered!.text).toContain(`/plates/${plateId}/history`);
  await expect.poll(async () => (await notice(plateId))?.state, { timeout: 30_000 }).toBe('sent');
  await admin.goto('/admin/outbox?state=sent');
  // The biologist's copy: other people holding the role get the same notice.
  const row = admin
    .getByRole('row')
    .filter({ has: admin.getByRole('link', { name: SUBJECT }) })
    .filter({ hasText: PEOPLE.biologist.email });
  await expect(row).toContainText('Sent');
  await expect(row).not.toContainText('ECONNREFUSED');
  expect((await notice(plateId))!.attempts).toBeGreaterThanOrEqual(2);
  await screenshot(admin, 'fault-mail-back-outbox');
});
