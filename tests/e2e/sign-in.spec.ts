import { expect, test } from '@playwright/test';

// Demo accounts come from seeders/20261201000100-demo-users.js (passwords for the local demo only).
const BIOLOGIST = { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' };

test('an anonymous visitor is sent to the sign-in page', async ({ page }) => {
  await page.goto('/plates');
  await expect(page).toHaveURL(/\/sign-in\?next=%2Fplates$/);
  await expect(page.getByRole('heading', { name: 'Sign in to Gatewell' })).toBeVisible();
  await expect(page.getByLabel('E-mail')).toBeVisible();
  await page.screenshot({ path: 'test-output/screenshots/sign-in.png', fullPage: true });
});

test('a wrong password gives one message that names neither field', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(BIOLOGIST.email);
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('main').getByRole('alert')).toHaveText(
    'That e-mail and password do not match an active account.',
  );
});

test('a biologist signs in, sees the shell, and signs out', async ({ page }) => {
  await page.goto('/sign-in?next=%2Fscreens');
  await page.getByLabel('E-mail').fill(BIOLOGIST.email);
  await page.getByLabel('Password').fill(BIOLOGIST.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/screens$/);
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  await page.screenshot({ path: 'test-output/screenshots/screens.png', fullPage: true });

  await page.getByRole('link', { name: 'My work' }).click();
  await expect(page.getByRole('heading', { name: 'My work' })).toBeVisible();
  await page.screenshot({ path: 'test-output/screenshots/my-work.png', fullPage: true });

  await page.getByRole('button', { name: 'Sign out' }).first().click();
  await expect(page).toHaveURL(/\/sign-in$/);
  await page.goto('/plates');
  await expect(page).toHaveURL(/\/sign-in/);
});
