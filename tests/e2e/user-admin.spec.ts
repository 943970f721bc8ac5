import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { AUDIT_EXPORT_HEADER, csvCells, DEMO, screenshot, signedInContext, signIn } from './support';

// One story, in order: an admin creates an account, its owner changes the password (their other session
// ends), signs out and in again, then the admin disables the account and the owner's session ends.
test.describe.configure({ mode: 'serial' });

const stamp = Date.now().toString(36);
const newcomer = {
  name: `Nia Newcomer ${stamp}`,
  email: `nia.${stamp}@gatewell.test`,
  first: 'first-pass-123',
  second: 'second-pass-456',
};

async function openAccount(page: Page) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
  await page.getByRole('link', { name: newcomer.name }).click();
  await expect(page.getByRole('heading', { level: 1, name: newcomer.name })).toBeVisible();
}

test('an admin creates a user with roles and an initial password', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'admin');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Users' })).toBeVisible();
  await expect(page.getByRole('region', { name: 'Users' }).getByText(DEMO.biologist.email)).toBeVisible({
    timeout: 15_000,
  });
  await screenshot(page, 'admin-users');

  await page.getByRole('link', { name: 'Create user' }).click();
  await page.getByRole('button', { name: 'Create account' }).click();
  await expect(page.locator('#field-name-error')).toHaveText('Enter the person’s name.');
  await expect(page.locator('#field-email-error')).toHaveText('Enter an e-mail address.');

  await page.getByLabel('Name').fill(newcomer.name);
  await page.getByLabel('E-mail', { exact: true }).fill(newcomer.email);
  await page.getByLabel(/^Biologist/).check();
  await page.getByLabel(/^Give them a one-time password/).check();
  await page.getByLabel('Initial password').fill('short');
  await page.getByRole('button', { name: 'Create account' }).click();
  await expect(page.locator('#field-password-error')).toHaveText('Use at least 10 characters.');
  await expect(page.getByLabel('Name')).toHaveValue(newcomer.name);
  await screenshot(page, 'admin-create-user-errors');

  await page.getByLabel('Initial password').fill(newcomer.first);
  await page.getByRole('button', { name: 'Create account' }).click();
  await expect(page.getByText(`Account created for ${newcomer.name}.`)).toBeVisible();
  await screenshot(page, 'admin-create-user-done');
  await page.getByRole('link', { name: 'Open the account' }).click();
  await expect(page.getByRole('checkbox', { name: /^Biologist/ })).toBeChecked();
  await context.close();
});

test('the new user changes their password: their other session ends, this one stays', async ({ browser }) => {
  const first = await browser.newContext();
  const other = await browser.newContext();
  const page = await first.newPage();
  const otherPage = await other.newPage();
  await signIn(page, newcomer.email, newcomer.first);
  await signIn(otherPage, newcomer.email, newcomer.first);

  // The password an admin set is good for this sign-in only: every page leads to the Account page, and the API refuses.
  await expect(page).toHaveURL(/\/account$/);
  await expect(page.getByRole('alert').filter({ hasText: 'Choose your own password first.' })).toBeVisible();
  await page.goto('/plates');
  await expect(page).toHaveURL(/\/account$/);
  const refused = await page.request.get('/api/import-templates');
  expect(refused.status()).toBe(403);
  expect((await refused.json()).message).toMatch(/choose your own on the Account page/);
  await screenshot(page, 'account-own-password-first');

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Account' }).click();
  await page.getByLabel('Current password').fill('not-my-password');
  await page.getByLabel('New password', { exact: true }).fill(newcomer.second);
  await page.getByLabel('New password again').fill(newcomer.second);
  await page.getByRole('button', { name: 'Change password' }).click();
  await expect(page.locator('#field-currentPassword-error')).toHaveText('That password is not right.');

  await page.getByLabel('Current password').fill(newcomer.first);
  await page.getByLabel('New password', { exact: true }).fill(newcomer.second);
  await page.getByLabel('New password again').fill(newcomer.second);
  await page.getByRole('button', { name: 'Change password' }).click();
  await expect(page.getByText('Password changed. Your other sessions have ended.')).toBeVisible();
  await screenshot(page, 'account-password-changed');

  await otherPage.goto('/plates');
  await expect(otherPage).toHaveURL(/\/sign-in/);
  await page.goto('/plates');
  await expect(page.getByRole('heading', { name: 'Plates' })).toBeVisible();

  await page.getByRole('button', { name: 'Sign out' }).first().click();
  await expect(page).toHaveURL(/\/sign-in$/);
  await page.getByLabel('E-mail', { exact: true }).fill(newcomer.email);
  await page.getByLabel('Password').fill(newcomer.first);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('main').getByRole('alert')).toHaveText(
    'That e-mail and password do not match an active account.',
  );
  await signIn(page, newcomer.email, newcomer.second);
  await first.close();
  await other.close();
});

test('the admin disables the user: their open session ends and they cannot sign in', async ({ browser }) => {
  const user = await browser.newContext();
  const userPage = await user.newPage();
  await signIn(userPage, newcomer.email, newcomer.second);

  const { context, page } = await signedInContext(browser, 'admin');
  await openAccount(page);
  await page.getByRole('button', { name: 'Disable account' }).click();
  await expect(page.locator('#status-reason-error')).toHaveText(
    'Say why (at least 3 characters); the audit trail keeps the reason.',
  );
  await page.getByLabel('Reason for disabling').fill('left the screening team');
  await page.getByRole('button', { name: 'Disable account' }).click();
  await expect(page.getByText(`${newcomer.name} is disabled and signed out everywhere.`)).toBeVisible();
  await expect(page.getByRole('button', { name: 'Enable account' })).toBeVisible();
  await screenshot(page, 'admin-user-disabled');

  await userPage.goto('/');
  await expect(userPage).toHaveURL(/\/sign-in/);
  await userPage.getByLabel('E-mail').fill(newcomer.email);
  await userPage.getByLabel('Password').fill(newcomer.second);
  await userPage.getByRole('button', { name: 'Sign in' }).click();
  await expect(userPage.getByRole('main').getByRole('alert')).toHaveText(
    'That e-mail and password do not match an active account.',
  );
  await context.close();
  await user.close();
});

test('an approver follows the account in the audit trail, filtered on the server', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'approver');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Audit trail' }).click();
  await page.getByLabel('Kind of object').selectOption({ label: 'Person' });
  await page.getByRole('button', { name: 'Filter' }).click();
  await expect(page).toHaveURL(/entityType=user/);
  const grid = page.getByRole('region', { name: 'Audit events' });
  await expect(grid.getByText('left the screening team')).toBeVisible();
  await grid.getByText('left the screening team').click();
  await expect(
    page.getByRole('region', { name: 'Chosen event' }).getByRole('row', { name: 'Account enabled yes no' }),
  ).toBeVisible();
  await screenshot(page, 'audit-trail-user');

  // The filtered trail downloads whole as csv: the filter in its head, only user events below.
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'csv', exact: true }).click(),
  ]);
  expect(download.suggestedFilename()).toMatch(/^gatewell-audit-trail-\d{4}-\d{2}-\d{2}-events\.csv$/);
  const lines = readFileSync((await download.path())!, 'utf8').split('\r\n');
  expect(lines).toContain('Filter,record type user');
  const cells = csvCells(readFileSync((await download.path())!, 'utf8'));
  const header = cells.findIndex((row) => row[0] === 'Event');
  expect(cells[header]).toEqual([...AUDIT_EXPORT_HEADER]);
  const events = cells.slice(header + 1);
  expect(events.length).toBeGreaterThan(0);
  expect(events.every((row) => row[11] === 'user' && row[7] === 'Person')).toBe(true);
  expect(events.some((row) => row[13] === 'left the screening team')).toBe(true);

  await page.getByLabel('From (UTC)').fill('2026-12-02T10:00');
  await page.getByLabel('To (UTC)').fill('2026-12-01T10:00');
  await page.getByRole('button', { name: 'Filter' }).click();
  await expect(page.locator('#filter-to-error')).toHaveText('The end of the range is before its start.');
  await context.close();
});

test('an admin cannot take the admin role from the last enabled admin', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'admin');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
  await page.getByRole('link', { name: 'Ada Admin' }).click();
  await page.getByRole('checkbox', { name: /^Admin/ }).uncheck();
  await page.getByLabel('Reason for the change').fill('trying to leave no admin');
  await page.getByRole('button', { name: 'Save roles' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'last enabled admin' })).toBeVisible();
  await context.close();
});
