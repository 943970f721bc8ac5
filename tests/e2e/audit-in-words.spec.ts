import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import pg from 'pg';
import {
  AUDIT_EXPORT_HEADER,
  csvCells,
  idsOnPage,
  queryOne,
  shootAtTwoSizes as shoot,
  signedInContext,
} from './support';

// The audit trail as people read it (names, labels, time zone, filters in the address, pages, the
// download of what the filters show) and the app's icons. Every page's walk for internal ids is in
// every-page.spec.ts.

// Screenshots at two sizes and many pages take long on a shared machine.
test.describe.configure({ timeout: 240_000 });

test('the app ships its own icons: no page asks for a favicon that is not there', async ({
  request,
  page,
}) => {
  for (const [address, type] of [
    ['/favicon.ico', 'image/x-icon'],
    ['/icon.svg', 'image/svg+xml'],
    ['/icon.png', 'image/png'],
    ['/apple-icon.png', 'image/png'],
  ] as const) {
    const response = await request.get(address, { maxRedirects: 0 });
    expect(response.status(), address).toBe(200);
    expect(response.headers()['content-type'], address).toContain(type);
  }
  // The sign-in page (no session) links its icons, and each link answers 200.
  const failed: string[] = [];
  page.on('response', (response) => {
    if (response.status() >= 400) failed.push(`${response.status()} ${response.url()}`);
  });
  await page.goto('/sign-in');
  const links = await page
    .locator('link[rel="icon"], link[rel="apple-touch-icon"]')
    .evaluateAll((nodes) => nodes.map((node) => (node as HTMLLinkElement).href));
  expect(links.length).toBeGreaterThanOrEqual(2);
  for (const link of links) expect((await page.request.get(link)).status(), link).toBe(200);
  expect(failed).toEqual([]);
});

test('the audit trail names people, objects and fields, and keeps its filters in the address', async ({
  browser,
}) => {
  const { context, page } = await signedInContext(browser, 'admin');
  await page.goto('/audit');
  await expect(page.getByRole('columnheader', { name: 'When (UTC)' })).toBeVisible();
  await page.getByLabel('Plate').fill('nav-p0');
  // The labels holding what was typed are fetched as it is typed (none are listed with the page).
  await expect(page.locator('#filter-plate-labels option[value="NAV-P02"]')).toHaveCount(1);
  await expect(page.locator('#filter-plate-labels option[value="KV-P01"]')).toHaveCount(0);
  await page.getByLabel('Compound').fill('GW-000');
  await expect(page.locator('#filter-compound-identifiers option[value="GW-0001"]')).toHaveCount(1);
  await page.getByLabel('Compound').fill('');
  await page.getByLabel('Plate').fill('NAV-P02');
  await page.getByLabel('What happened').selectOption({ label: 'Approved' });
  await page.getByRole('button', { name: 'Filter' }).click();
  await expect(page).toHaveURL(/[?&]plate=NAV-P02(&|$)/);
  await expect(page).toHaveURL(/[?&]action=approve(&|$)/);
  const grid = page.getByRole('region', { name: 'Audit events' });
  // The seeder approves NAV-P02 once (scripts/seed-demo.ts), as an approver.
  await expect(page.getByText('Events 1–1 of 1, newest first')).toBeVisible();
  await expect(grid.getByText('Plate NAV-P02')).toBeVisible();
  await expect(grid.getByText('Approved', { exact: true })).toBeVisible();
  await expect(grid.getByText(/\(approver\)/)).toBeVisible();
  await expect(grid.getByText(/State: submitted → approved/)).toBeVisible();
  await expect(
    grid.getByText(/^(Mon|Tue|Wed|Thu|Fri|Sat|Sun), \d{1,2} \w{3} \d{4}, \d{2}:\d{2}:\d{2} UTC$/),
  ).toBeVisible();
  await grid.getByText('Plate NAV-P02').click();
  const chosen = page.getByRole('region', { name: 'Chosen event' });
  await expect(chosen.getByRole('rowheader', { name: 'State' })).toBeVisible();
  expect(await idsOnPage(page)).toEqual([]);
  await shoot(page, 'audit-trail-filtered');

  // The same address opened afresh shows the same filter in the form.
  await page.goto(page.url());
  await expect(page.getByLabel('Plate')).toHaveValue('NAV-P02');
  await expect(page.getByLabel('What happened')).toHaveValue('approve');

  // Every event of the plate (its wells' included) with the person and the object in words, no ids.
  await page.goto('/audit?plate=NAV-P02');
  const expected = await queryOne<{ n: number }>(
    `select count(*)::int as n from audit_events a
      where (a.entity_type = 'plate' and a.entity_id in (select id::text from plates where label = 'NAV-P02'))
         or (a.entity_type = 'well' and a.entity_id in (select w.id::text from wells w join plates p on p.id = w.plate_id where p.label = 'NAV-P02'))`,
  );
  await expect(
    page.getByText(new RegExp(`^Events 1–${expected!.n} of ${expected!.n}, newest first`)),
  ).toBeVisible();
  await expect(grid.getByText('Approved', { exact: true })).toBeVisible();
  await expect(grid.getByText('Plate NAV-P02').first()).toBeVisible();
  expect(await idsOnPage(page)).toEqual([]);
  await context.close();
});

test('the audit trail pages through many events, and downloads every event the filter shows', async ({
  browser,
}) => {
  // Set-up: 105 changes of one demo compound's molecular weight, appended to the trail as the app's role
  // may (insert only), by the demo chemist.
  const compound = await queryOne<{ id: string; identifier: string }>(
    'select id, identifier from compounds order by identifier limit 1',
  );
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    await client.query(
      `insert into audit_events (actor_id, action, entity_type, entity_id, before, after, occurred_at)
       select (select id from users where email = 'chemist@gatewell.test'), 'update', 'compound', $1,
              jsonb_build_object('molecularWeight', 300 + n), jsonb_build_object('molecularWeight', 301 + n),
              now() - make_interval(mins => n)
         from generate_series(1, 105) as n`,
      [compound!.id],
    );
  } finally {
    await client.end();
  }
  const total = (await queryOne<{ n: number }>(
    `select count(*)::int as n from audit_events a
      where (a.entity_type = 'compound' and a.entity_id = $1::text)
         or (a.entity_type = 'batch' and a.entity_id in (select id::text from batches where compound_id::text = $1::text))
         or (a.entity_type = 'compound_alias' and a.entity_id in (select id::text from compound_aliases where compound_id::text = $1::text))
         or (a.entity_type = 'plate' and a.after ->> 'compoundId' = $1::text)`,
    [compound!.id],
  ))!.n;
  expect(total).toBeGreaterThan(105);

  const { context, page } = await signedInContext(browser, 'approver');
  await page.goto(`/audit?compound=${encodeURIComponent(compound!.identifier)}`);
  await expect(page.getByText(`Events 1–100 of ${total}, newest first (page 1 of 2)`)).toBeVisible();
  const grid = page.getByRole('region', { name: 'Audit events' });
  await expect(grid.getByText(`Compound ${compound!.identifier}`).first()).toBeVisible();
  await expect(grid.getByText(/^Molecular weight \(g\/mol\): \d+ → \d+$/).first()).toBeVisible();
  await page.getByRole('link', { name: 'Older' }).click();
  await expect(page).toHaveURL(/[?&]page=2(&|$)/);
  await expect(page).toHaveURL(/[?&]compound=/);
  await expect(page.getByText(`Events 101–${total} of ${total}, newest first (page 2 of 2)`)).toBeVisible();
  expect(await idsOnPage(page)).toEqual([]);
  await shoot(page, 'audit-trail-page-2');

  // A page past the last says so and leads to the last page.
  await page.goto(`/audit?compound=${encodeURIComponent(compound!.identifier)}&page=7`);
  await expect(page.getByText('There is no page 7')).toBeVisible();
  await expect(page.getByText(`These filters give ${total} events on 2 pages.`)).toBeVisible();
  await page.getByRole('link', { name: 'Go to the last page' }).click();
  await expect(page.getByText(`Events 101–${total} of ${total}, newest first (page 2 of 2)`)).toBeVisible();

  // The download from page 2 holds every page of the filter, each row the compound's, in words.
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'csv', exact: true }).click(),
  ]);
  const cells = csvCells(readFileSync((await download.path())!, 'utf8'));
  expect(cells.some((row) => row[0] === 'Filter' && row[1] === `compound ${compound!.identifier}`)).toBe(
    true,
  );
  const header = cells.findIndex((row) => row[0] === 'Event');
  expect(cells[header]).toEqual([...AUDIT_EXPORT_HEADER]);
  const rows = cells.slice(header + 1);
  expect(rows).toHaveLength(total);
  expect(
    rows.filter((row) => /^Molecular weight \(g\/mol\): \d+ → \d+$/.test(row[9]!)).length,
  ).toBeGreaterThanOrEqual(105);
  expect(rows.every((row) => row[8]!.startsWith(compound!.identifier))).toBe(true);
  await context.close();
});

test('bulk registration says what it is doing and cannot be started twice', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'chemist');
  await page.goto('/compounds');
  const identifier = `GW-BUSY-${Date.now()}`;
  await page.getByLabel('Registration sheet (xlsx, xls or csv)').setInputFiles({
    name: 'busy.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from(`identifier,name\n${identifier},Busy probe\n`, 'utf8'),
  });
  // Hold the server's answer so the working state can be seen, then let it through.
  let release: () => void = () => {};
  const held = new Promise<void>((resolve) => (release = resolve));
  await page.route('**/api/compounds/bulk', async (route) => {
    await held;
    await route.continue();
  });
  await page.getByRole('button', { name: 'Check rows' }).click();
  const checking = page.getByRole('button', { name: 'Checking rows…' });
  await expect(checking).toBeDisabled();
  await expect(checking).toHaveAttribute('aria-busy', 'true');
  await expect(page.getByRole('button', { name: /^Register .*compound\(s\)/ })).toBeDisabled();
  release();
  await expect(page.getByText('All 1 rows are ready to register.')).toBeVisible();
  await page.getByRole('button', { name: 'Register 1 compound(s)' }).click();
  await expect(page.getByRole('status').filter({ hasText: '1 compound(s) registered.' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Register 1 compound(s)' })).toBeDisabled();
  await context.close();
});
