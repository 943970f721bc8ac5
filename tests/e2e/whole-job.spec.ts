import { expect, test, type Page } from '@playwright/test';
import * as XLSX from 'xlsx';
import { dbRow, PEOPLE, shot, signedIn } from './signoff-support';
import { expectOneReadImport, freshPotassiumExport, watchImportSteps } from './support';

// The whole job on demo data, in the browser: a biologist imports an export, reviews QC, excludes a
// well, reads the fits and the forecast and submits; a chemist verifies the compound map; an approver
// approves with an e-signature; the signed, locked plate is exported.
const LABEL = 'KV-WHOLE-JOB';

async function signStep(page: Page, plateUrl: string, button: string, password: string, state: string) {
  await page.goto(`${plateUrl}/history`);
  await page.getByLabel('Your password, to sign').fill(password);
  await page.getByRole('button', { name: `Sign: ${button}` }).click();
  await expect(
    page.getByRole('status').filter({ hasText: `Signed. Plate ${LABEL} is now ${state}` }),
  ).toBeVisible();
}

test('import, review, exclude, fits and forecast, verify, submit, approve with signature, export', async ({
  browser,
}) => {
  test.setTimeout(240_000);
  const biologist = await signedIn(browser, 'biologist');

  // Import.
  await biologist.getByRole('link', { name: 'Import a plate' }).click();
  const sent = watchImportSteps(biologist);
  const importedFile = freshPotassiumExport();
  await biologist.getByLabel('Screen').selectOption({ label: 'Potassium counter-screen (Kv7.2)' });
  await biologist
    .getByLabel(/Instrument export/)
    .setInputFiles({ name: 'kv-whole-job.csv', mimeType: 'text/csv', buffer: importedFile });
  await biologist.getByRole('button', { name: 'Read file' }).click();
  await biologist.getByRole('button', { name: 'Check every row' }).click();
  await biologist.getByLabel('Plate label').fill(LABEL);
  await biologist.getByRole('button', { name: 'Store plate' }).click();
  await expect(biologist.getByRole('heading', { name: new RegExp(`Plate ${LABEL}`) })).toBeVisible();
  await expectOneReadImport(sent, LABEL, importedFile);
  const plateUrl = new URL(biologist.url()).pathname;

  // Review QC and exclude one passing GW-0009 well.
  await expect(biologist.getByText(/^Z′ \d\.\d\d$/)).toBeVisible();
  const grid = biologist.getByRole('region', { name: 'Wells of Kv7.2' });
  await grid
    .getByRole('row')
    .filter({ hasText: 'GW-0009' })
    .filter({ hasText: 'passed' })
    .first()
    .getByRole('checkbox')
    .check();
  await biologist.getByLabel(/Reason/).fill('whole-job test: seal drift seen in the trace');
  await biologist.getByRole('button', { name: 'Exclude', exact: true }).click();
  await expect(
    biologist.getByText('1 well(s) excluded; QC recomputed, fits queued for a refit.'),
  ).toBeVisible();
  // The refit is a job that the worker process takes; the page shows it until the fits are current.
  await expect(biologist.getByTestId('fit-status')).toBeHidden({ timeout: 30_000 });

  // Fits and forecast.
  await biologist.getByRole('link', { name: 'Fits' }).click();
  await expect(biologist.getByRole('table', { name: 'Fit results' })).toContainText('GW-0009');
  await biologist.getByRole('link', { name: 'Forecast' }).click();
  await expect(biologist.getByRole('note', { name: 'Caution' })).toContainText(
    'Research decision support, not a safety determination.',
  );
  await expect(
    biologist
      .getByRole('figure')
      .filter({ hasText: 'Voltage traces at the reference drive' })
      .locator('path')
      .first(),
  ).toBeVisible({ timeout: 60_000 });
  await shot(biologist, 'whole-job-1-forecast');

  // Sign-off: chemist verifies, biologist submits, approver approves.
  const chemist = await signedIn(browser, 'chemist');
  await signStep(chemist, plateUrl, 'Verify the compound map', PEOPLE.chemist.password, 'verified');
  await signStep(biologist, plateUrl, 'Submit for approval', PEOPLE.biologist.password, 'submitted');
  const approver = await signedIn(browser, 'approver');
  await signStep(approver, plateUrl, 'Approve', PEOPLE.approver.password, 'approved');
  await expect(
    approver.getByText('Approved and locked: wells, exclusions, readouts and fits can no longer change.'),
  ).toBeVisible();
  await shot(approver, 'whole-job-2-approved');

  // The locked plate refuses exclusions, and its export carries the state, the signatures and the caution.
  await biologist.goto(plateUrl);
  await expect(
    biologist.getByText('This plate is approved and locked: wells can no longer be excluded.'),
  ).toBeVisible();
  const workbook = await approver.request.get(
    `/api/plates${plateUrl.slice('/plates'.length)}/export?format=xlsx`,
  );
  expect(workbook.status()).toBe(200);
  const book = XLSX.read(await workbook.body());
  const about = Object.fromEntries(
    XLSX.utils
      .sheet_to_json<string[]>(book.Sheets['About this export']!, { header: 1 })
      .map((r) => [r[0], r[1]]),
  );
  expect(about.State).toBe('Approved');
  expect(about.Caution).toMatch(/research decision support/i);
  const signoff = XLSX.utils.sheet_to_json<Record<string, unknown>>(book.Sheets['Sign-off']!, { range: 0 });
  expect(JSON.stringify(signoff)).toContain('Arun Approver');

  // The download is in the audit trail: the approver, the plate, the form and the file.
  const plateId = plateUrl.split('/').at(-1);
  const exported = await dbRow<{ email: string; after: { format: string; file: string } }>(
    `select u.email, a.after from audit_events a join users u on u.id = a.actor_id where a.action = 'export' and a.entity_type = 'plate' and a.entity_id = $1`,
    [plateId],
  );
  expect(exported).toMatchObject({
    email: PEOPLE.approver.email,
    after: { format: 'xlsx', file: `gatewell-plate-${LABEL}.xlsx` },
  });
});
