import { expect, test } from '@playwright/test';
import { waitForMessages } from '../../support/fake-smtp';
import { DEMO, screenshot, signedInContext } from '../support';
import { database, importThroughApi, potassiumScreenId, waitForHealthy } from './fault-support';

// The database goes away under the running production server and comes back; the server is never
// restarted. Meanwhile every answer says plainly that nothing was changed; afterwards the same server
// signs people in, lists plates and takes an import through the API.
const UNAVAILABLE =
  'Gatewell cannot reach its database just now, so nothing was changed. Try again in a minute.';

test('with the database stopped the server answers clearly, and once it is back the server serves again without a restart', async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(240_000);
  const screenId = await potassiumScreenId();
  const { page } = await signedInContext(browser, 'biologist');
  await page.goto('/plates');
  await expect(page.getByRole('link', { name: 'NAV-P01' })).toBeVisible();

  await database('stop', 'immediate');
  try {
    const health = await page.request.get('/api/health');
    expect(health.status()).toBe(503);
    expect(await health.json()).toMatchObject({
      status: 'database_unreachable',
      database: { connected: false },
    });

    // A signed-in page: Gatewell's own error card, not a bare server error.
    await page.goto('/plates');
    const failed = page.getByRole('alert').filter({ hasText: 'This page could not be shown' });
    await expect(failed).toContainText('Something failed on the server; nothing was changed.');
    await screenshot(page, 'fault-database-down-page');

    // The import API refuses with 503 and a message; the sign-in form keeps its place and says why.
    const refused = await importThroughApi(page.request, baseURL!, screenId, 'KV-DURING-OUTAGE');
    expect(refused).toEqual({ status: 503, body: { error: 'unavailable', message: UNAVAILABLE } });
    const visitor = await (await browser.newContext()).newPage();
    await visitor.goto('/sign-in');
    await visitor.getByLabel('E-mail').fill(DEMO.approver.email);
    await visitor.getByLabel('Password').fill(DEMO.approver.password);
    await visitor.getByRole('button', { name: 'Sign in' }).click();
    await expect(visitor.getByRole('alert').filter({ hasText: UNAVAILABLE })).toBeVisible();
    await expect(visitor.getByLabel('E-mail')).toHaveValue(DEMO.approver.email);
  } finally {
    await database('start');
  }
  await waitForHealthy(page.request);

  // The failed page recovers through its own "Try again"; the session from before the outage still holds.
  await page.getByRole('button', { name: 'Try again' }).click();
  await expect(page.getByRole('link', { name: 'NAV-P01' })).toBeVisible();

  // A fresh sign-in, and an import through the API, on the same server process.
  const { page: fresh } = await signedInContext(browser, 'biologist');
  const imported = await importThroughApi(fresh.request, baseURL!, screenId, 'KV-AFTER-OUTAGE');
  expect(imported.status, JSON.stringify(imported.body)).toBe(201);
  await fresh.goto(String(imported.body.href));
  await expect(fresh.getByRole('heading', { name: /Plate KV-AFTER-OUTAGE/ })).toBeVisible();
  await fresh.goto('/plates');
  await expect(fresh.getByRole('link', { name: 'KV-AFTER-OUTAGE' })).toBeVisible();
});

test('right after an immediate restart (a crash and recovery) the first requests are served from a renewed pool', async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(180_000);
  const screenId = await potassiumScreenId();
  const { page } = await signedInContext(browser, 'biologist');
  await page.goto('/plates');
  await expect(page.getByRole('link', { name: 'NAV-P01' })).toBeVisible();

  // pg.sh restart returns once the cluster accepts connections again; no health poll before the next requests.
  await database('restart', 'immediate');
  await page.goto('/plates');
  await expect(page.getByRole('link', { name: 'NAV-P01' })).toBeVisible();
  const { page: approver } = await signedInContext(browser, 'approver');
  await approver.goto('/plates');
  await expect(approver.getByRole('link', { name: 'KV-P01' })).toBeVisible();
  const imported = await importThroughApi(page.request, baseURL!, screenId, 'KV-AFTER-RESTART');
  expect(imported.status, JSON.stringify(imported.body)).toBe(201);
  expect((await (await page.request.get('/api/health')).json()).status).toBe('ok');
  // The server's background mail sender (a pass every 15 s) came through the restart too: the chemists' notice goes out.
  await waitForMessages(
    (m) => m.subject === 'Gatewell: plate KV-AFTER-RESTART imported: compound map to verify',
    1,
    90_000,
  );
});
