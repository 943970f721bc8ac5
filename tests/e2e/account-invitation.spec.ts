import { expect, test } from '@playwright/test';
import { waitForMessages } from '../support/fake-smtp';
import { screenshot, signedInContext } from './support';

// An admin creates an account and Gatewell e-mails its owner a link (the run's fake SMTP server); the
// owner chooses a password through it and signs in straight to their work, with nobody else knowing it.
test('an account by invitation: the owner gets a link by e-mail, chooses a password and signs in', async ({
  browser,
}) => {
  test.setTimeout(90_000);
  const stamp = Date.now().toString(36);
  const invitee = {
    name: `Ines Invited ${stamp}`,
    email: `ines.${stamp}@gatewell.test`,
    password: 'my very own phrase',
  };

  const { context: adminContext, page: admin } = await signedInContext(browser, 'admin');
  await admin.goto('/admin/users/new');
  await admin.getByLabel('Name').fill(invitee.name);
  await admin.getByLabel('E-mail', { exact: true }).fill(invitee.email);
  // No role: this person reads results only, so other tests' sign-off notices pass them by.
  await expect(admin.getByLabel(/^E-mail them a link/)).toBeChecked();
  await expect(admin.getByLabel('Initial password')).toHaveCount(0);
  await screenshot(admin, 'admin-invite-user');
  await admin.getByRole('button', { name: 'Create account' }).click();
  await expect(
    admin.getByText(`A link to choose their password is on its way to ${invitee.email}`),
  ).toBeVisible();
  await expect(admin.getByText('nobody else learns it')).toBeVisible();
  await adminContext.close();

  const [mail] = await waitForMessages(
    (m) =>
      m.envelope.to.includes(invitee.email) &&
      m.subject === 'Gatewell: your account, and a link to choose your password',
    1,
    40_000,
  );
  expect(mail!.text).toContain(`made a Gatewell account for you: ${invitee.email}, to read results.`);
  const link = /(https?:\/\/\S+\/password-link\/[A-Za-z0-9_-]{43})/.exec(mail!.text)?.[1];
  expect(link, mail!.text).toBeTruthy();

  const owner = await (await browser.newContext()).newPage();
  await owner.goto(link!);
  await expect(owner.getByRole('heading', { name: 'Choose a new password' })).toBeVisible();
  await owner.getByLabel('New password', { exact: true }).fill(invitee.password);
  await owner.getByLabel('New password again').fill(invitee.password);
  await owner.getByRole('button', { name: 'Set new password' }).click();
  await expect(owner).toHaveURL(/\/sign-in\?password=set$/);
  await owner.getByLabel('E-mail', { exact: true }).fill(invitee.email);
  await owner.getByLabel('Password', { exact: true }).fill(invitee.password);
  await owner.getByRole('button', { name: 'Sign in' }).click();
  // Their own password from the start: no detour to the Account page.
  await expect(owner.getByRole('heading', { name: 'My work' })).toBeVisible();
  await screenshot(owner, 'invited-user-signed-in');
});
