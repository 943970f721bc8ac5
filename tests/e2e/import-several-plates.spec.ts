import { randomBytes } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { layout } from '../fixtures/export-layouts';
import { truthRoleCounts } from '../support/layout-truth';
import { DEMO, screenshot, signIn } from './support';

/**
 * A file of several plates (issue 18) through the wizard: the invented layout with two 96-well plates in
 * one tab-separated table told apart by a plate barcode column (tests/fixtures/export-layouts), mapped once
 * (the role and target words the guess does not place; the plate column is proposed), checked plate by
 * plate, stored as two plates with a link to each, and saved as a template; then a second file of the
 * layout, recognised by its header with no click on the mapping step, stored as two more plates.
 */

/** The truth's count of one role summed over the file's plates. */
const sumRoles = (role: 'negativeControl' | 'positiveControl' | 'test') =>
  facts.plates.reduce((n, p) => n + truthRoleCounts(p.label)[role], 0);

const folder = mkdtempSync(join(tmpdir(), 'gatewell-several-'));
const written = layout('plate-column-tsv').write();
const { facts } = written;

/**
 * The layout's file, or another file of it: the same rows and a blank line more at its end (skipped on
 * import), so that its bytes differ while every well, and so the truth, stays the same.
 */
function exportFile(name: string, another: boolean): string {
  let text = new TextDecoder().decode(written.bytes);
  if (another) text = `${text}\n\n`;
  const path = join(folder, name);
  writeFileSync(path, text);
  return path;
}

async function readFile(page: Page, path: string) {
  await page.goto('/plates/import');
  const value = await page
    .getByLabel('Screen')
    .locator('option', { hasText: 'Potassium counter-screen (' })
    .getAttribute('value');
  await page.getByLabel('Screen').selectOption(value!);
  await page.getByLabel(/Instrument export/).setInputFiles(path);
  await page.getByRole('button', { name: 'Read file' }).click();
  await expect(page.getByRole('button', { name: 'Check every row' })).toBeVisible();
}

/** Checks every row, expects the file's two plates listed by barcode, stores them; returns the stored plates. */
async function checkAndStore(page: Page, name: string, templateName?: string) {
  await page.getByRole('button', { name: 'Check every row' }).click();
  const list = page.getByRole('region', { name: 'Plates in this file' });
  await expect(list.getByRole('heading', { name: 'Plates in this file (2)' })).toBeVisible();
  // Each plate's own facts, from the truth: wells, format, wells by role, wells QC flags (exactly its
  // bad wells), no QC rule left unapplied (the file has every QC readout), no errors.
  for (const [i, plate] of facts.plates.entries()) {
    await expect(list.getByLabel(`Label of plate ${i + 1}`)).toHaveValue(plate.label);
    const cells = list.locator(`tr[data-plate="${plate.label}"] td`);
    await expect(cells.nth(2)).toHaveText(String(plate.wellCount));
    await expect(cells.nth(3)).toHaveText(String(plate.format));
    const roles = truthRoleCounts(plate.label);
    await expect(cells.nth(4)).toHaveText(
      `${roles.negativeControl} negative · ${roles.positiveControl} positive · ${roles.test} test · 0 empty`,
    );
    await expect(cells.nth(5)).toHaveText(String(plate.badWells.length));
    await expect(cells.nth(6)).toHaveText('none');
    await expect(cells.nth(8)).toHaveText(/^No errors/);
  }
  // The file's totals are sums over its plates, in the list and in the headline.
  const wells = facts.plates.reduce((n, p) => n + p.wellCount, 0);
  const totals = list.locator('tr[data-plate-total] td');
  await expect(totals.nth(0)).toHaveText(String(wells));
  await expect(totals.nth(2)).toHaveText(
    `${sumRoles('negativeControl')} negative · ${sumRoles('positiveControl')} positive · ${sumRoles('test')} test · 0 empty`,
  );
  await expect(totals.nth(3)).toHaveText(String(facts.plates.reduce((n, p) => n + p.badWells.length, 0)));
  await expect(page.getByLabel('Check totals')).toContainText(`Plates${facts.plates.length}`);
  await expect(page.getByLabel('Check totals')).toContainText(`Wells, all plates${wells}`);
  await expect(page.getByText(`The rows below are those of plate ${facts.plates[0]!.label}`)).toBeVisible();
  if (templateName) await page.getByLabel('Save this mapping as a template (optional)').fill(templateName);
  await screenshot(page, `import-several-plates-${name}-check`);
  const storeButton = page.getByRole('button', { name: 'Store 2 plates' });
  await expect(storeButton).toBeEnabled();
  await storeButton.click();
  const stored = page.getByRole('status').filter({ hasText: 'Stored 2 plates from this file' });
  await expect(stored).toBeVisible({ timeout: 60_000 });
  await screenshot(page, `import-several-plates-${name}-stored`);
  const ids: string[] = [];
  for (const plate of facts.plates) {
    const href = await stored.getByRole('link', { name: plate.label, exact: true }).getAttribute('href');
    expect(href).toMatch(/^\/plates\/[0-9a-f-]{36}$/);
    ids.push(href!.split('/').pop()!);
  }
  return ids;
}

/** Each stored plate holds the truth's wells (read through the signed-in answers its page reads). */
async function expectWells(page: Page, ids: string[]) {
  for (const [i, plateId] of ids.entries()) {
    const wells = (await (await page.request.get(`/api/plates/${plateId}/wells`)).json()) as {
      wells: { position: string }[];
    };
    expect(new Set(wells.wells.map((w) => w.position)).size).toBe(facts.plates[i]!.wellCount);
  }
}

test('a file of two plates is mapped once, stored as two plates, and its next file needs no mapping click', async ({
  page,
}) => {
  test.setTimeout(240_000);
  await signIn(page, DEMO.biologist.email, DEMO.biologist.password);
  const templateName = `plate column ${randomBytes(3).toString('hex')}`;

  await readFile(page, exportFile(`first-${written.filename}`, false));
  // The guess proposes the plate column.
  const plates = page.getByRole('group', { name: 'Plates in this file' });
  await expect(plates.getByLabel('A plate column')).toBeChecked();
  await expect(plates.getByLabel('Plate column', { exact: true })).toHaveValue('Plate barcode');
  const { roleWords, targetWords } = facts;
  await page.getByLabel(`Role of the value “${roleWords.vehicle}”`).selectOption('vehicle');
  await page.getByLabel(`Role of the value “${roleWords.reference}”`).selectOption('reference');
  await page.getByLabel(`Role of the value “${roleWords.test}”`).selectOption('test');
  for (const [target, word] of Object.entries(targetWords))
    await page.getByLabel(`Screen target for the value “${word}”`).selectOption(target);
  await screenshot(page, 'import-several-plates-mapping');
  const first = await checkAndStore(page, 'first', templateName);
  await expectWells(page, first);

  // The second file: recognised by the template; nothing is clicked on the mapping step.
  await readFile(page, exportFile(`second-${written.filename}`, true));
  await expect(
    page.getByRole('status').filter({ hasText: `match the template “${templateName}”` }),
  ).toBeVisible();
  await expect(plates.getByLabel('A plate column')).toBeChecked();
  const second = await checkAndStore(page, 'second');
  expect(second.filter((id) => first.includes(id))).toEqual([]);
  await expectWells(page, second);
});
