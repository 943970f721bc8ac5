import { randomBytes } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { FILE_TARGETS, twoReadoutExport } from '../fixtures/two-readouts/two-readout-export';
import { DEMO, fitsSettled, screenshot, signIn } from './support';

/**
 * Block read at two moments (issue 20 point 2) through the screens: an admin names a screen's targets'
 * tonic and use-dependent readouts; a biologist maps the invented two-readout export
 * (tests/fixtures/two-readouts) once, saving it as a template, stores it, sees both fits and their
 * ratio on the fits tab and the compound profile, and the forecast with tonic block only beside
 * state-dependent block; a second export of the same layout goes through the JSON import route with the
 * template, whose answer lists the readouts per target. The ratio shown is checked against the fits'
 * own IC50s as the fits answer gives them (tonic ÷ use-dependent, worked here).
 */

const CAUTION = 'Research decision support, not a safety determination.';
const folder = mkdtempSync(join(tmpdir(), 'gatewell-two-readouts-'));
const tag = randomBytes(3).toString('hex');
const screenName = `Use-dependence screen ${tag}`;
const templateName = `Two readouts ${tag}`;

function exportFile(seed?: number) {
  const file = twoReadoutExport(seed);
  const path = join(folder, `${seed ?? 'first'}-${file.filename}`);
  writeFileSync(path, file.bytes);
  return { file, path };
}

async function addTarget(page: Page, name: string, conductance: string) {
  const form = page.locator('form').filter({ has: page.getByRole('button', { name: 'Add target' }) });
  await form.getByLabel('Target (as the export names it)').fill(name);
  await form.getByLabel('Model conductance').selectOption(conductance);
  await form.getByLabel('Tonic readout name (optional)').fill('first pulse');
  await form.getByLabel('Use-dependent readout name (blank: one readout)').fill('10th pulse');
  await form.getByRole('button', { name: 'Add target' }).click();
  await expect(
    page.getByRole('row').filter({ has: page.getByRole('cell', { name, exact: true }) }),
  ).toContainText('first pulse (tonic) · 10th pulse (use-dependent)');
}

interface FitJson {
  compound: string;
  target: string;
  readout: string;
  status: string;
  ic50_uM: number | null;
}

test('two readouts: mapped once, both fits and their ratio, the forecast tonic and state-dependent', async ({
  page,
  browser,
}) => {
  test.setTimeout(600_000);
  // The admin makes the screen: fast-spiking preset (its rate falls under Na inactivation shifts), two
  // readouts named on each target.
  const admin = await browser.newPage();
  await signIn(admin, DEMO.admin.email, DEMO.admin.password);
  await admin.goto('/screens/new');
  await admin.getByLabel('Name', { exact: true }).fill(screenName);
  await admin.getByLabel('Neuron preset').selectOption('wang-buzsaki-1996');
  await admin.getByLabel('Exposures of interest (µM)').fill('0.3, 1');
  await admin.getByRole('button', { name: 'Create screen' }).click();
  await expect(admin.getByRole('heading', { name: screenName })).toBeVisible();
  await addTarget(admin, 'Nav1.7', 'gNa');
  await addTarget(admin, 'Kv7.2', 'gK');
  await admin.close();

  await signIn(page, DEMO.biologist.email, DEMO.biologist.password);
  const first = exportFile();
  await page.goto('/plates/import');
  const option = await page
    .getByLabel('Screen')
    .locator('option', { hasText: `${screenName} (` })
    .getAttribute('value');
  await page.getByLabel('Screen').selectOption(option!);
  await page.getByLabel(/Instrument export/).setInputFiles(first.path);
  await page.getByRole('button', { name: 'Read file' }).click();
  await expect(page.getByRole('button', { name: 'Check every row' })).toBeVisible();
  // The guess reads the tenth pulse's column as the use-dependent block; the target words are mapped by hand.
  await expect(page.getByLabel('use-dependent block', { exact: true })).toHaveValue('P10 block (%)');
  await expect(page.getByLabel('block', { exact: true })).toHaveValue('P1 block (%)');
  for (const [word, target] of Object.entries(FILE_TARGETS))
    await page.getByLabel(`Screen target for the value “${word}”`).selectOption(target);
  await screenshot(page, 'two-readouts-mapping');
  await page.getByRole('button', { name: 'Check every row' }).click();
  await expect(page.getByRole('button', { name: 'Store plate' })).toBeEnabled();
  await page.getByLabel('Plate label').fill(`TWO-${tag}`);
  await page.getByLabel('Save this mapping as a template (optional)').fill(templateName);
  await page.getByRole('button', { name: 'Store plate' }).click();
  await page.waitForURL(/\/plates\/[0-9a-f-]{36}$/, { timeout: 60_000 });
  const plateId = /\/plates\/([0-9a-f-]{36})$/.exec(page.url())![1]!;
  await fitsSettled(page, plateId);

  // Both fits per compound and target, and their ratio on the fits tab.
  const { fits } = (await (await page.request.get(`/api/plates/${plateId}/fits`)).json()) as {
    fits: FitJson[];
  };
  const fitOf = (readout: string) =>
    fits.find((f) => f.compound === 'GW-0001' && f.target === 'Nav1.7' && f.readout === readout)!;
  const tonic = fitOf('tonic');
  const useDependent = fitOf('use_dependent');
  expect([tonic.status, useDependent.status]).toEqual(['fitted', 'fitted']);
  const ratio = Number((tonic.ic50_uM! / useDependent.ic50_uM!).toPrecision(3)).toString();
  await page.goto(`/plates/${plateId}/fits`);
  const pairs = page.getByRole('table', { name: 'Tonic and use-dependent IC50 per compound and target' });
  const row = pairs.getByRole('row').filter({ hasText: 'GW-0001' }).filter({ hasText: 'Nav1.7' });
  await expect(row).toContainText(ratio);
  await expect(page.locator('[data-readout="use_dependent"]').first()).toBeVisible();
  await screenshot(page, 'two-readouts-fits');

  // The compound profile: the use-dependence ratio per target.
  const compoundId = (
    (await (await page.request.get(`/api/plates/${plateId}/forecast`)).json()) as {
      compounds: { compoundId: string; compound: string }[];
    }
  ).compounds.find((c) => c.compound === 'GW-0001')!.compoundId;
  await page.goto(`/compounds/${compoundId}/profile`);
  const card = page.getByTestId('use-dependence').filter({ hasText: 'Nav1.7' });
  await expect(card).toContainText('IC50 tonic (first pulse) ÷ IC50 use-dependent (10th pulse)');
  await expect(card).toContainText(ratio);
  await screenshot(page, 'two-readouts-profile');

  // The forecast: tonic block only beside state-dependent block, the caution kept.
  await page.goto(`/plates/${plateId}/forecast`);
  await expect(page.getByRole('note', { name: 'Caution' })).toContainText(CAUTION);
  await expect(page.getByRole('heading', { name: `GW-0001 on TWO-${tag}` })).toBeVisible();
  const side = page.getByRole('table', { name: 'Forecast with tonic and with state-dependent block' });
  await expect(side).toBeVisible({ timeout: 300_000 });
  await expect(side.getByRole('rowheader')).toHaveText(['Control', '0.3 µM', '1 µM']);
  await expect(page.getByText(/10th pulse IC50 [\d.]+ µM as Ki/).first()).toBeVisible();
  await screenshot(page, 'two-readouts-forecast');

  // A second export of the layout through the JSON route, with the template: readouts per target.
  const second = exportFile(2037);
  const answer = await page.request.post('/api/imports/plate', {
    headers: { origin: new URL(page.url()).origin },
    multipart: {
      screen: screenName,
      template: templateName,
      label: `TWO-${tag}-B`,
      file: { name: 'second.csv', mimeType: 'text/csv', buffer: Buffer.from(second.file.bytes) },
    },
    timeout: 120_000,
  });
  expect(answer.status(), await answer.text()).toBe(201);
  const body = (await answer.json()) as { facts: { readouts: Record<string, string[]> } };
  expect(Object.values(body.facts.readouts)).toEqual([
    ['tonic', 'use_dependent'],
    ['tonic', 'use_dependent'],
  ]);
});
