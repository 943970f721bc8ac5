import { expect, test } from '@playwright/test';
import { queryOne, screenshot, signedInContext } from './support';

// An address with nothing behind it answers 404 with Gatewell's "Not found" card, for a signed-in
// person as for a browser that reloads it: a record page must refuse before its page starts streaming
// (once the first bytes are out the status can no longer change). Common practice (HTTP semantics,
// RFC 9110 15.5.5), no numbers from a source.
const NOBODY = '00000000-0000-4000-8000-000000000000';

test('pages for records that do not exist answer 404 with the not-found card', async ({ browser }) => {
  const { context, page } = await signedInContext(browser, 'admin');
  const plate = await queryOne<{ id: string }>('select id from plates order by imported_at limit 1');
  const compound = await queryOne<{ id: string }>('select id from compounds order by identifier limit 1');
  expect(plate && compound).toBeTruthy();

  const missing = [
    `/plates/${NOBODY}`,
    `/plates/${NOBODY}/fits`,
    `/plates/${NOBODY}/history`,
    `/plates/${NOBODY}/forecast`,
    '/plates/not-a-plate',
    `/compounds/${NOBODY}`,
    `/compounds/${NOBODY}/profile`,
    `/screens/${NOBODY}`,
    `/admin/users/${NOBODY}`,
    '/no-such-page',
  ];
  for (const address of missing) {
    const response = await page.goto(address);
    expect(response?.status(), address).toBe(404);
    await expect(page.getByRole('heading', { name: 'Not found' }), address).toBeVisible();
    // A missing record keeps the signed-in shell around the card; an address no route matches has none.
    await expect(page.getByRole('navigation', { name: 'Main' }), address).toHaveCount(
      address === '/no-such-page' ? 0 : 1,
    );
  }
  await page.goto(`/plates/${NOBODY}/fits`);
  await screenshot(page, 'not-found-signed-in');

  // The records that do exist still answer 200 at the same addresses, tabs and loading fallbacks included.
  for (const address of [
    `/plates/${plate!.id}`,
    `/plates/${plate!.id}/fits`,
    `/plates/${plate!.id}/history`,
    `/compounds/${compound!.id}`,
    `/compounds/${compound!.id}/profile`,
  ]) {
    const response = await page.goto(address);
    expect(response?.status(), address).toBe(200);
    await expect(page.getByRole('heading', { name: 'Not found' })).toHaveCount(0);
  }
  await context.close();
});
