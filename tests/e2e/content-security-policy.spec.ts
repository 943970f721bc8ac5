import { expect, test, type Page, type Response } from '@playwright/test';
import { DEMO, queryOne } from './support';

// Every main page opened as the demo biologist under Gatewell's CSP: the header is on each answer, and
// the browser reports no violation (console messages and 'securitypolicyviolation' events both count).

/** Collects every CSP violation the page reports, across navigations. */
async function watchViolations(page: Page): Promise<string[]> {
  const violations: string[] = [];
  page.on('console', (message) => {
    if (/Content[- ]Security[- ]Policy/i.test(message.text())) violations.push(`console: ${message.text()}`);
  });
  await page.exposeFunction('gatewellCspViolation', (text: string) => violations.push(`event: ${text}`));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      const report = (window as unknown as { gatewellCspViolation: (text: string) => void })
        .gatewellCspViolation;
      report(
        `${event.violatedDirective} blocked ${event.blockedURI || 'inline'} at ${event.sourceFile}:${event.lineNumber}`,
      );
    });
  });
  return violations;
}

/** The policy of one document answer, checked for the directives Gatewell relies on. */
function policyOf(response: Response | null): string {
  expect(response, 'a document answer').not.toBeNull();
  const policy = response!.headers()['content-security-policy'] ?? '';
  expect(policy).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}' 'strict-dynamic'/);
  for (const directive of [
    "default-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
  ]) {
    expect(policy).toContain(directive);
  }
  expect(response!.headers()['x-content-type-options']).toBe('nosniff');
  expect(response!.headers()['x-frame-options']).toBe('DENY');
  return policy;
}

/** The grid's theme arrives in nonce-carrying style tags: its rounded wrapper shows they were applied. */
async function expectStyledGrid(page: Page, name: string | RegExp) {
  const wrapper = page.getByRole('region', { name }).first().locator('.ag-root-wrapper').first();
  await expect(wrapper).toBeVisible();
  await expect.poll(() => wrapper.evaluate((el) => getComputedStyle(el).borderTopLeftRadius)).toBe('8px');
}

test('the main pages work under the Content-Security-Policy with no violation', async ({ page }) => {
  const violations = await watchViolations(page);
  const plate = await queryOne<{ id: string }>('select id from plates where label = $1', ['NAV-P01']);

  const first = policyOf(await page.goto('/sign-in'));
  const second = policyOf(await page.goto('/sign-in'));
  expect(second, 'a fresh nonce per request').not.toBe(first);
  await page.getByLabel('E-mail').fill(DEMO.biologist.email);
  await page.getByLabel('Password').fill(DEMO.biologist.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('heading', { name: 'My work' })).toBeVisible();

  policyOf(await page.goto('/'));
  await expect(page.getByRole('heading', { name: 'My work' })).toBeVisible();

  policyOf(await page.goto('/plates'));
  await expect(page.getByRole('heading', { name: 'Plates', exact: true })).toBeVisible();

  policyOf(await page.goto(`/plates/${plate!.id}`));
  await expectStyledGrid(page, /^Wells of /);

  policyOf(await page.goto(`/plates/${plate!.id}/fits`));
  await expect(page.getByRole('article').filter({ hasText: 'GW-0001' }).first()).toBeVisible();

  policyOf(await page.goto(`/plates/${plate!.id}/forecast`));
  await expect(
    page
      .getByRole('figure')
      .filter({ hasText: 'Voltage traces at the reference drive' })
      .locator('path')
      .first(),
  ).toBeVisible({ timeout: 30_000 });

  policyOf(await page.goto('/compounds'));
  await expectStyledGrid(page, 'Registered compounds');

  policyOf(await page.goto('/plates/import'));
  await expect(page.getByRole('button', { name: 'Read file' })).toBeVisible();

  expect(violations).toEqual([]);
});

// The browser keeps the policy, and so the nonce, of the answer that loaded the document. Signing in
// through the form renders the signed-in pages from the server action's answer, with a nonce of its own:
// grids opened by links from there must still carry the document's nonce.
test('after signing in through the form, grids opened by links are styled under the document’s nonce', async ({
  page,
}) => {
  const violations = await watchViolations(page);
  policyOf(await page.goto('/sign-in'));
  await page.getByLabel('E-mail').fill(DEMO.biologist.email);
  await page.getByLabel('Password').fill(DEMO.biologist.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('heading', { name: 'My work' })).toBeVisible();

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Compounds' }).click();
  await expectStyledGrid(page, 'Registered compounds');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Plates' }).click();
  await page.getByRole('link', { name: 'NAV-P01' }).click();
  await expectStyledGrid(page, /^Wells of /);
  expect(violations).toEqual([]);
});
