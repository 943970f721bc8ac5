import { expect, test, type Page } from '@playwright/test';
import pg from 'pg';
import * as XLSX from 'xlsx';

// Demo account from seeders/20261201000100-demo-users.js (password for the local demo only).
const BIOLOGIST = { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' };
const CAUTION = 'Research decision support, not a safety determination.';

async function idOf(sql: string, value: string): Promise<string> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    return (await client.query<{ id: string }>(sql, [value])).rows[0]!.id;
  } finally {
    await client.end();
  }
}

async function signIn(page: Page) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(BIOLOGIST.email);
  await page.getByLabel('Password').fill(BIOLOGIST.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
}

const shot = (page: Page, name: string) =>
  page.screenshot({ path: `test-output/screenshots/${name}.png`, fullPage: true });
const traces = (page: Page) =>
  page.getByRole('figure').filter({ hasText: 'Voltage traces at the reference drive' });

test('a plate’s forecast shows the caution, traces, f–I curves and the sweep; one compound or all at once', async ({
  page,
}) => {
  // Each forecast now runs the model 200 times per exposure for its bands (seconds of work per compound,
  // minutes for the whole plate on a shared 2-core machine), so this test waits longer than the default.
  test.setTimeout(600_000);
  const plateId = await idOf('select id from plates where label = $1', 'NAV-P01');
  await signIn(page);
  await page.goto(`/plates/${plateId}`);
  await page.getByRole('link', { name: 'Forecast' }).click();
  await expect(page).toHaveURL(new RegExp(`/plates/${plateId}/forecast$`));
  await expect(page.getByRole('note', { name: 'Caution' })).toContainText(CAUTION);
  await expect(page.getByRole('heading', { name: 'GW-0001 on NAV-P01' })).toBeVisible();
  await expect(traces(page).locator('path').first()).toBeVisible({ timeout: 180_000 });
  await expect(traces(page)).toContainText('GW-0001 at 1 µM');
  // Each target beside the model conductance it blocks, in the screen's preset (seed-demo: Nav1.7 → gNa,
  // on the Pospischil et al. 2008 regular-spiking cell).
  const mapping = page.getByRole('region', { name: 'Targets in the model' });
  await expect(mapping).toContainText('Nav1.7 → gNa');
  await expect(mapping).toContainText('Cortical regular-spiking neuron (Pospischil et al. 2008)');
  await expect(page.getByRole('figure').filter({ hasText: 'f–I curves' })).toBeVisible();
  await expect(page.getByRole('figure').filter({ hasText: 'Rheobase against concentration' })).toBeVisible();
  const excitability = page.getByRole('table', { name: 'Excitability beside control at each exposure' });
  await expect(excitability.getByRole('rowheader', { name: 'Control' })).toBeVisible();
  // The demo's GW-0001 was generated with IC50 0.045 µM and Hill slope 1.1 (seeders/data/demo-plates/
  // nav-96-plate-01.xlsx.manifest.json). By hand, the Hill equation b = 1 / (1 + (IC50 / C)^h) at 0.3 µM:
  // (0.045 / 0.3)^1.1 = 0.15^1.1 = 0.1241, b = 1 / 1.1241 = 0.890, so about 89 % of gNa blocked; the fit
  // of the noisy demo wells lands within a few points of it. Sodium block raises rheobase (common-practice
  // physiology), so the row's rheobase change is an increase. Fails if the block shown were not the
  // Hill block of the compound's potency, or the forecast moved rheobase the wrong way.
  const row = excitability.getByRole('row').filter({ has: page.getByRole('rowheader', { name: '0.3 µM' }) });
  const blockShown = /gNa (\d+\.\d) %/.exec(await row.getByRole('cell').nth(0).innerText());
  expect(blockShown).not.toBeNull();
  expect(Math.abs(Number(blockShown![1]) - 89.0)).toBeLessThan(5);
  // Cells after the row header: block, rest, rheobase (its value, then its change beside control).
  await expect(excitability.getByRole('columnheader').nth(3)).toHaveText('Rheobase (µA/cm²)');
  await expect(row.getByRole('cell').nth(2)).toContainText(/\+\d+\.\d %/);
  // Uncertainty bands (200 draws of each fit's log IC50 and Hill slope): the exposure's rheobase has its
  // 95 % range beneath it, both sweep plots shade a band, and the note says how the draws were made.
  await expect(row.getByRole('cell').nth(2)).toContainText(/95 %: \d/);
  await expect(page.getByTestId('forecast-band')).toHaveCount(2);
  await expect(page.getByTestId('forecast-band-note')).toContainText('200 draws');
  await expect(page.getByTestId('forecast-band-note')).toContainText('covariance');
  await shot(page, 'plate-forecast');

  // Traces at another exposure, chosen from the keyboard.
  await page.getByRole('radio', { name: '1 µM', exact: true }).focus();
  await page.keyboard.press('ArrowLeft');
  await expect(page.getByRole('radio', { name: '0.3 µM', exact: true })).toBeChecked();
  await expect(traces(page)).toContainText('GW-0001 at 0.3 µM', { timeout: 30_000 });

  await page.getByRole('button', { name: /GW-0002/ }).click();
  await expect(page.getByRole('heading', { name: 'GW-0002 on NAV-P01' })).toBeVisible();
  await expect(traces(page)).toContainText('GW-0002 at 0.3 µM', { timeout: 180_000 });

  await page.getByRole('button', { name: /^Forecast the \d+ not yet computed$/ }).click();
  // The run is one job on the queue; the worker process computes each missing forecast and reports progress.
  await expect(page.getByText(/^Last run: \d+ of \d+ forecasts computed and stored\.$/)).toBeVisible({
    timeout: 420_000,
  });
  await expect(
    page.getByRole('navigation', { name: 'Compounds on this plate' }).getByText('Forecast stored'),
  ).toHaveCount(5);

  await page.setViewportSize({ width: 820, height: 1180 });
  await shot(page, 'plate-forecast-tablet');
});

test('forecast and export routes answer bad input with a clear message, and exports carry the caution and state', async ({
  page,
}) => {
  const plateId = await idOf('select id from plates where label = $1', 'NAV-P01');
  await signIn(page);
  const bad = await page.request.get(`/api/plates/${plateId}/forecast?compoundId=GW-0001`);
  expect(bad.status()).toBe(422);
  expect((await bad.json()).fields.compoundId).toEqual([
    'compoundId must be the id of a compound on this plate.',
  ]);
  const compoundId = await idOf('select id from compounds where identifier = $1', 'GW-0001');
  const far = await page.request.get(`/api/plates/${plateId}/forecast?compoundId=${compoundId}&at=7`);
  expect(far.status()).toBe(422);
  expect((await far.json()).message).toMatch(
    /^at must be the index of one of the screen’s 4 exposures \(0–3\)\.$/,
  );
  const csv = await page.request.get(`/api/plates/${plateId}/export?format=csv`);
  expect(csv.status()).toBe(422);
  expect((await csv.json()).fields.table).toEqual([
    'A csv file holds one table: add table=wells, fits, forecast, signoff.',
  ]);

  const workbook = await page.request.get(`/api/plates/${plateId}/export?format=xlsx`);
  expect(workbook.status()).toBe(200);
  expect(workbook.headers()['content-disposition']).toBe(
    'attachment; filename="gatewell-plate-NAV-P01.xlsx"',
  );
  const book = XLSX.read(await workbook.body());
  const about = Object.fromEntries(
    XLSX.utils
      .sheet_to_json<string[]>(book.Sheets['About this export']!, { header: 1 })
      .map((r) => [r[0], r[1]]),
  );
  expect(about.Caution).toMatch(/research decision support/);
  expect(about.State).toMatch(/^(Imported|Map verified|Awaiting approval|Approved|Returned)$/);
  expect(book.SheetNames).toEqual([
    'About this export',
    'Sign-off',
    'Wells',
    'Fits',
    'Forecast at exposures',
  ]);
  const forecastSheet = XLSX.utils.sheet_to_json<unknown[]>(book.Sheets['Forecast at exposures']!, {
    header: 1,
  });
  const header = forecastSheet.find((r) => r.includes('Rheobase 2.5 % (µA/cm²)'));
  expect(header).toEqual(
    expect.arrayContaining(['Rheobase 97.5 % (µA/cm²)', 'Rate 2.5 % (Hz)', 'Band draws']),
  );
  const wells = await page.request.get(`/api/plates/${plateId}/export?format=csv&table=wells`);
  expect(wells.headers()['content-type']).toBe('text/csv; charset=utf-8');
  expect(await wells.text()).toContain('Well,Role,Compound,Concentration (µM),Target');
});

test('a compound profile gathers fits across plates, selectivity and the forecast at exposure, with downloads', async ({
  page,
}) => {
  const compoundId = await idOf('select id from compounds where identifier = $1', 'GW-0001');
  await signIn(page);
  await page.goto(`/compounds/${compoundId}`);
  await page.getByRole('link', { name: 'Profile across plates' }).click();
  await expect(page.getByRole('heading', { name: 'GW-0001 profile' })).toBeVisible();
  const fits = page.getByRole('table', { name: 'Fits of the compound across plates and screens' });
  await expect(fits.getByRole('link', { name: 'KV-P01' })).toBeVisible();
  await expect(fits.getByRole('link', { name: 'NAV-P01' })).toBeVisible();
  await expect(page.getByText('IC50 Kv7.2 ÷ IC50 Nav1.7')).toBeVisible();
  await expect(page.getByRole('note', { name: 'Caution' })).toContainText(CAUTION);
  await expect(traces(page).locator('path').first()).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId('forecast-band').first()).toBeVisible();
  await shot(page, 'compound-profile');

  await page.locator('summary', { hasText: 'Download' }).click();
  const download = page.waitForEvent('download');
  await page.getByRole('button', { name: 'Workbook with every table (xlsx)' }).click();
  expect((await download).suggestedFilename()).toBe('gatewell-compound-GW-0001.xlsx');
});
