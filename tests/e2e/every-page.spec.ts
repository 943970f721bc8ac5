import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { idsOnPage, mainPages, shootAtTwoSizes, signedInContext } from './support';

// One walk over every page of Gatewell (signed out, as an admin, and the biologist's import page), each
// opened once and checked for two things:
// - no internal id in what a person reads: UUIDs, worker names (host:pid), process ids, long hex;
// - no accessibility violation of serious or critical impact, by axe-core (the open-source accessibility
//   engine, from the npm registry) with its WCAG 2.1 A and AA rules. The rules and impact levels are
//   axe-core's own; "serious or critical" is the bar issue 21 sets.
// Each finding is listed by page, so a failure says what to mend.

test.describe.configure({ timeout: 300_000 });

const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

async function seriousViolations(page: Page, address: string): Promise<string[]> {
  const result = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
  return result.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .flatMap((violation) =>
      violation.nodes.map(
        (node) =>
          `${address}: ${violation.id} (${violation.impact}) at ${node.target.join(' ')}: ${violation.help}`,
      ),
    );
}

interface Findings {
  ids: string[];
  accessibility: string[];
}

async function check(page: Page, address: string, findings: Findings): Promise<void> {
  const response = await page.goto(address);
  expect(response?.status(), address).toBe(200);
  await page.waitForLoadState('networkidle');
  findings.ids.push(...(await idsOnPage(page)).map((id) => `${address}: ${id}`));
  findings.accessibility.push(...(await seriousViolations(page, address)));
}

test('every page: no internal id on screen, and no serious or critical accessibility violation', async ({
  browser,
}) => {
  const findings: Findings = { ids: [], accessibility: [] };

  const visitor = await browser.newContext();
  const anonymous = await visitor.newPage();
  for (const address of ['/sign-in', '/lost-password']) await check(anonymous, address, findings);
  await visitor.close();

  const { pages, plate } = await mainPages();
  const { context, page } = await signedInContext(browser, 'admin');
  for (const address of pages) await check(page, address, findings);

  const biologist = await signedInContext(browser, 'biologist');
  await check(biologist.page, '/plates/import', findings);
  await biologist.context.close();

  expect(findings.ids).toEqual([]);
  expect(findings.accessibility).toEqual([]);

  // Screens to look at, at two sizes: a plate (its jobs and timeline, its wells), the compounds page.
  await page.goto(`/plates/${plate.id}/history`);
  await shootAtTwoSizes(page, 'plate-history');
  await page.goto(`/plates/${plate.id}`);
  await shootAtTwoSizes(page, 'plate-wells');
  await page.goto('/compounds');
  await shootAtTwoSizes(page, 'compounds-bulk');
  await context.close();
});
