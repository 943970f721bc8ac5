import { expect, test } from '@playwright/test';
import { layout } from '../fixtures/export-layouts';
import { screenshot, signIn } from './support';

// Demo biologist from seeders/20261201000100-demo-users.js (password for the local demo only).
const BIOLOGIST = { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' };

test('a plate-grid export is read as a table of one row per well, and its layout can be switched', async ({
  page,
}) => {
  await signIn(page, BIOLOGIST.email, BIOLOGIST.password);
  await page.goto('/plates/import');
  const file = layout('grid-96-tsv').write();
  const screen = page.getByLabel('Screen');
  const option = screen.locator('option', { hasText: 'Pain sodium screen' });
  await screen.selectOption({ label: (await option.textContent())!.trim() });
  await page.getByLabel(/Instrument export/).setInputFiles({
    name: file.filename,
    mimeType: 'text/tab-separated-values',
    buffer: Buffer.from(file.bytes),
  });
  await page.getByRole('button', { name: 'Read file' }).click();

  // Gatewell found the grids: the mapping step offers the grids' titles and the "Target" line as columns.
  const choice = page.getByLabel('How the sheet lays out its wells');
  await expect(choice.locator('option:checked')).toHaveText('Plate grids, one per readout (8 grids)');
  await expect(page.locator('#map-well')).toHaveValue('Well');
  await expect(page.locator('#map-compoundCurrent')).toHaveValue('Peak current after (pA)');
  await expect(page.locator('#map-target')).toHaveValue('Target');
  await screenshot(page, 'import-grid-mapping');

  // Read as one row per well and target, the sheet offers its own first row instead.
  await choice.selectOption({ label: 'One row per well and target' });
  await expect(page.locator('#map-compoundCurrent')).toHaveValue('');
  await choice.selectOption({ label: 'Plate grids, one per readout (8 grids)' });
  await expect(page.locator('#map-compoundCurrent')).toHaveValue('Peak current after (pA)');

  await page.getByRole('button', { name: 'Check every row' }).click();
  await expect(page.getByRole('region', { name: 'Preview of every row' })).toBeVisible();
  await screenshot(page, 'import-grid-preview');
});
