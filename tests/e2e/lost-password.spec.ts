import { expect, test } from '@playwright/test';
import argon2 from 'argon2';
import { waitForMessages } from '../support/fake-smtp';
import { queryOne, screenshot } from './support';

// Someone who lost their password asks for a link on the sign-in page, gets it by e-mail through the
// real SMTP path (the run's fake server), chooses a new password and signs in with it; the link then no
// longer works. A person of its own with no role (so that sign-off notices of other tests pass them by),
// and the demo accounts keep their passwords for other tests.
test('a lost password: the link comes by e-mail, sets a new password once, and the person signs in with it', async ({
  page,
}) => {
  test.setTimeout(90_000);
  const email = `lost-password-${Date.now()}@gatewell.test`;
  await queryOne(`insert into users (email, name, password_hash) values ($1, 'Robin Lostword', $2)`, [
    email,
    await argon2.hash('the forgotten password', { type: argon2.argon2id }),
  ]);

  await page.goto('/sign-in');
  await page.getByRole('link', { name: 'Lost your password?' }).click();
  await expect(page.getByRole('heading', { name: 'Lost your password?' })).toBeVisible();
  await page.getByLabel('E-mail').fill(email);
  await page.getByRole('button', { name: 'Send me a link' }).click();
  await expect(
    page.getByRole('status').filter({
      hasText: `If ${email} belongs to an active Gatewell account, a link to choose a new password is on its way there.`,
    }),
  ).toBeVisible();
  await screenshot(page, 'lost-password-sent');

  const [mail] = await waitForMessages(
    (m) => m.envelope.to.includes(email) && m.subject === 'Gatewell: choose a new password',
    1,
    40_000,
  );
  const link = /(https?:\/\/\S+\/password-link\/[A-Za-z0-9_-]{43})/.exec(mail!.text)?.[1];
  expect(link, mail!.text).toBeTruthy();

  await page.goto(link!);
  await expect(page.getByRole('heading', { name: 'Choose a new password' })).toBeVisible();
  await expect(page.getByText(email)).toBeVisible();
  await page.getByLabel('New password', { exact: true }).fill('short');
  await page.getByLabel('New password again').fill('short');
  await page.getByRole('button', { name: 'Set new password' }).click();
  await expect(page.getByText('Use at least 10 characters.')).toBeVisible();
  await page.getByLabel('New password', { exact: true }).fill('a remembered phrase');
  await page.getByLabel('New password again').fill('a remembered phrase');
  await screenshot(page, 'lost-password-new');
  await page.getByRole('button', { name: 'Set new password' }).click();

  await expect(page).toHaveURL(/\/sign-in\?password=set$/);
  await expect(page.getByRole('status').filter({ hasText: 'Your new password is set' })).toBeVisible();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill('a remembered phrase');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('heading', { name: 'My work' })).toBeVisible();

  // Spent: the same link now says so, and changes nothing.
  await page.goto(link!);
  await expect(page.getByRole('heading', { name: 'This link does not work' })).toBeVisible();
  await expect(page.getByRole('alert').filter({ hasText: 'This link has been used already.' })).toBeVisible();
  await screenshot(page, 'lost-password-spent');
});
