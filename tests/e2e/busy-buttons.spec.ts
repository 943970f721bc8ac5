import { expect, test, type Page, type Request } from '@playwright/test';
import { freshPotassiumExport, queryOne, shootAtTwoSizes, signedInContext } from './support';

// Buttons that start work stay disabled, say what they are doing and are marked busy until the work ends.
// Each request is held by the test (page.route) so the state in flight is seen, then let go or broken off.

test.describe.configure({ timeout: 120_000 });

/** Holds the first request `match` picks until the test lets it go or breaks it off. */
async function hold(page: Page, match: (request: Request) => boolean) {
  let decide!: (how: 'continue' | 'abort') => void;
  const decided = new Promise<'continue' | 'abort'>((resolve) => (decide = resolve));
  let arrive!: () => void;
  const arrived = new Promise<void>((resolve) => (arrive = resolve));
  let taken = false;
  await page.route('**/*', async (route) => {
    if (taken || !match(route.request())) return route.fallback();
    taken = true;
    arrive();
    if ((await decided) === 'abort') await route.abort('failed');
    else await route.fallback();
  });
  return { arrived, release: () => decide('continue'), abort: () => decide('abort') };
}

// The wells table, which computes nothing: a workbook would store the plate's forecasts for later tests.
test('a plate export: the button is busy until the file has come', async ({ browser }) => {
  const plate = (await queryOne<{ id: string }>(
    `select id from plates where format = 96 order by imported_at limit 1`,
  ))!;
  const { context, page } = await signedInContext(browser, 'chemist');
  await page.goto(`/plates/${plate.id}`);
  await page.locator('summary', { hasText: 'Download' }).click();
  const held = await hold(page, (r) => /\/api\/plates\/[^/]+\/export\?format=csv&table=wells/.test(r.url()));
  const button = page.getByRole('button', { name: 'Wells (csv)' });
  await button.click();
  await held.arrived;
  const busy = page.getByRole('button', { name: 'Preparing the file…' });
  await expect(busy).toBeDisabled();
  await expect(busy).toHaveAttribute('aria-busy', 'true');
  await shootAtTwoSizes(page, 'busy-plate-export');
  const download = page.waitForEvent('download');
  held.release();
  expect((await download).suggestedFilename()).toMatch(/\.csv$/);
  await expect(button).toBeEnabled();
  await expect(button).not.toHaveAttribute('aria-busy');
  await context.close();
});

test('a form of a server action: Save is busy until the action answers', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'chemist');
  await page.goto('/account');
  const choice = page.getByRole('region', { name: 'How you are told' });
  await choice.getByLabel(/^By e-mail and in Gatewell/).check();
  const held = await hold(page, (r) => r.method() === 'POST' && new URL(r.url()).pathname === '/account');
  await choice.getByRole('button', { name: 'Save' }).click();
  await held.arrived;
  const busy = choice.getByRole('button', { name: 'Saving…' });
  await expect(busy).toBeDisabled();
  await expect(busy).toHaveAttribute('aria-busy', 'true');
  await shootAtTwoSizes(page, 'busy-account-save');
  held.release();
  await expect(choice.getByRole('button', { name: 'Save' })).toBeEnabled();
  await expect(choice.getByText('No change: already by e-mail and in Gatewell.')).toBeVisible();
  await context.close();
});

test('an import: Read file is busy with its progress until the server answers', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'biologist');
  await page.goto('/plates/import');
  await page.getByLabel('Screen').selectOption({ label: 'Potassium counter-screen (Kv7.2)' });
  await page
    .getByLabel(/Instrument export/)
    .setInputFiles({ name: 'kv-busy.csv', mimeType: 'text/csv', buffer: freshPotassiumExport() });
  const held = await hold(page, (r) => new URL(r.url()).pathname === '/api/imports/inspect');
  await page.getByRole('button', { name: 'Read file' }).click();
  await held.arrived;
  const busy = page.getByRole('button', { name: 'Reading…' });
  await expect(busy).toBeDisabled();
  await expect(busy).toHaveAttribute('aria-busy', 'true');
  await expect(page.getByRole('status', { name: 'Progress' })).toContainText('Uploading the file');
  await shootAtTwoSizes(page, 'busy-import-read');
  // The connection breaks: the button comes back, with a message, and nothing was read.
  held.abort();
  await expect(page.getByRole('button', { name: 'Read file' })).toBeEnabled();
  await context.close();
});
