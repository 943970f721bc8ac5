import { expect, test } from '@playwright/test';
import { expectOneReadImport, freshPotassiumExport, watchImportSteps } from './support';

// Demo biologist from seeders/20261201000100-demo-users.js (password for the local demo only).
const BIOLOGIST = { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' };

test('a biologist imports an export, reviews QC, excludes a well and sees the fit change', async ({
  page,
}) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(BIOLOGIST.email);
  await page.getByLabel('Password').fill(BIOLOGIST.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('heading', { name: 'My work' })).toBeVisible();

  await page.getByRole('link', { name: 'Import a plate' }).click();
  const sent = watchImportSteps(page);
  const exported = freshPotassiumExport();
  await page.getByLabel('Screen').selectOption({ label: 'Potassium counter-screen (Kv7.2)' });
  await page
    .getByLabel(/Instrument export/)
    .setInputFiles({ name: 'kv-rerun.csv', mimeType: 'text/csv', buffer: exported });
  await page.getByRole('button', { name: 'Read file' }).click();
  await expect(page.getByLabel('well position')).not.toHaveValue('');
  await page.screenshot({ path: 'test-output/screenshots/import-mapping.png', fullPage: true });

  await page.getByRole('button', { name: 'Check every row' }).click();
  await expect(page.getByText('Rows with errors')).toBeVisible();
  await expect(page.getByRole('region', { name: 'Preview of every row' })).toBeVisible();
  await page.screenshot({ path: 'test-output/screenshots/import-preview.png', fullPage: true });
  await page.getByLabel('Plate label').fill('KV-RERUN-E2E');
  await page.getByRole('button', { name: 'Store plate' }).click();

  await expect(page.getByRole('heading', { name: /Plate KV-RERUN-E2E/ })).toBeVisible();
  // The file went to the server once; preview and commit named the draft inspect kept, which the plate used.
  await expectOneReadImport(sent, 'KV-RERUN-E2E', exported);
  await expect(page.getByText(/^Z′ \d\.\d\d$/)).toBeVisible();
  await page.screenshot({ path: 'test-output/screenshots/plate-wells.png', fullPage: true });

  // Read GW-0009's fit (a Kv7.2 blocker in the demo) before and after excluding one of its wells.
  await page.getByRole('link', { name: 'Fits' }).click();
  const card = page.getByRole('article').filter({ hasText: 'GW-0009' });
  const wellsUsed = async () => Number(await card.locator('dt:has-text("Wells used") + dd').innerText());
  await expect(card).toBeVisible();
  const before = await wellsUsed();

  await page.getByRole('link', { name: 'Wells and QC' }).click();
  const grid = page.getByRole('region', { name: 'Wells of Kv7.2' });
  const row = grid.getByRole('row').filter({ hasText: 'GW-0009' }).filter({ hasText: 'passed' }).first();
  await row.getByRole('checkbox').check();
  await expect(page.getByText('1 well(s) selected')).toBeVisible();
  await page.getByLabel(/Reason/).fill('seal lost during compound addition (e2e)');
  await page.getByRole('button', { name: 'Exclude', exact: true }).click();
  await expect(page.getByText('1 well(s) excluded; QC recomputed, fits queued for a refit.')).toBeVisible();

  await page.getByRole('link', { name: 'Fits' }).click();
  await expect(card).toBeVisible();
  await expect.poll(wellsUsed).toBe(before - 1);
  await page.screenshot({ path: 'test-output/screenshots/plate-fits.png', fullPage: true });
});
