import { expect, test, type Page } from '@playwright/test';
import { queryOne, signedInContext } from './support';

// Notices in Gatewell, walked once as the demo chemist: the bell's count, the Notices page, opening a
// notice (its plate opens and the count falls), marking one seen, and the choice on the Account page.

test.describe.configure({ timeout: 120_000 });

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

async function shoot(page: Page, name: string) {
  for (const [width, height] of [
    [1440, 900],
    [1024, 768],
  ] as const) {
    await page.setViewportSize({ width, height });
    await page.screenshot({ path: `test-output/screenshots/${name}-${width}x${height}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1280, height: 860 });
}

/** The chemist's new notices as the database holds them. */
const unseenInDatabase = async () =>
  (await queryOne<{ n: number }>(
    `select count(*)::int as n from notices n join users u on u.id = n.recipient_id
      where u.email = 'chemist@gatewell.test' and n.seen_at is null`,
  ))!.n;

const bellLabel = (n: number) => (n ? `Notices, ${n} new` : 'Notices, none new');

test('the bell counts new notices; opening one goes to its plate and the count falls', async ({
  browser,
}) => {
  const { context, page } = await signedInContext(browser, 'chemist');
  // The demo imports told the chemist (scripts/seed-demo.ts imports plates for chemists to verify).
  const before = await unseenInDatabase();
  expect(before).toBeGreaterThanOrEqual(2);
  await page.goto('/');
  const bell = page.getByRole('link', { name: /^Notices, / });
  await expect(bell).toHaveAccessibleName(bellLabel(before));
  await expect(page.getByTestId('notice-count')).toHaveText(String(before));
  await bell.click();

  await expect(page).toHaveURL(/\/notices$/);
  await expect(page.getByRole('heading', { level: 1, name: 'Notices' })).toBeVisible();
  await expect(page.getByText(new RegExp(`^Notices 1–\\d+ of \\d+, ${before} new`))).toBeVisible();
  expect(await page.locator('body').innerText()).not.toMatch(UUID);
  await shoot(page, 'notices-list');

  // Open the newest new notice about an imported plate: it names the plate, and its link opens it.
  const item = page
    .getByRole('listitem')
    .filter({ has: page.getByText('New', { exact: true }) })
    .filter({ hasText: /^New\s*Plate \S+ imported: compound map to verify/ })
    .first();
  const title = (await item.getByRole('heading').innerText()).replace(/^New\s*/, '');
  const label = /^Plate (\S+) imported/.exec(title)![1]!;
  await item.getByRole('button', { name: 'Open the plate' }).click();
  await expect(page).toHaveURL(/\/plates\/[0-9a-f-]{36}\/history$/);
  await expect(page.getByRole('heading', { level: 1 })).toContainText(label);
  await expect(page.getByRole('link', { name: /^Notices, / })).toHaveAccessibleName(bellLabel(before - 1));
  expect(await unseenInDatabase()).toBe(before - 1);

  // Back on the list the opened notice reads as seen; marking another seen lowers the count again.
  await page.getByRole('link', { name: /^Notices, / }).click();
  await expect(page.getByRole('listitem').filter({ hasText: title }).first()).toContainText('Seen');
  await page
    .getByRole('listitem')
    .filter({ has: page.getByText('New', { exact: true }) })
    .first()
    .getByRole('button', { name: 'Mark seen' })
    .click();
  await expect(page.getByRole('link', { name: /^Notices, / })).toHaveAccessibleName(bellLabel(before - 2));
  expect(await unseenInDatabase()).toBe(before - 2);

  // The choice on the Account page: in Gatewell only, then back to the default (later tests mail the chemist).
  await page.goto('/account');
  const choice = page.getByRole('region', { name: 'How you are told' });
  await expect(choice.getByText(/No e-mail is needed for the record/)).toBeVisible();
  await choice.getByLabel(/^In Gatewell only/).check();
  await choice.getByRole('button', { name: 'Save' }).click();
  await expect(choice.getByText('Saved: in Gatewell only.', { exact: true })).toBeVisible();
  const stored = () =>
    queryOne<{ delivery: string }>(
      `select d.delivery from notice_delivery d join users u on u.id = d.user_id where u.email = 'chemist@gatewell.test'`,
    );
  expect(await stored()).toEqual({ delivery: 'app_only' });
  await shoot(page, 'account-notice-choice');
  await choice.getByLabel(/^By e-mail and in Gatewell/).check();
  await choice.getByRole('button', { name: 'Save' }).click();
  await expect(choice.getByText('Saved: by e-mail and in Gatewell.', { exact: true })).toBeVisible();
  expect(await stored()).toEqual({ delivery: 'mail_and_app' });
  await context.close();
});

test('the bell counts a new notice without a reload: on its timer and when the window comes back', async ({
  browser,
}) => {
  const { context, page } = await signedInContext(browser, 'chemist');
  const tell = (title: string) =>
    queryOne(
      `insert into notices (recipient_id, kind, title, body_text, link_path)
       select id, 'plate_imported', $1, 'A notice written by the live-bell test.', '/plates'
         from users where email = 'chemist@gatewell.test'`,
      [title],
    );
  // The page's own clock, so the bell's 30-second timer can be run on at once.
  await page.clock.install();
  await page.goto('/');
  const before = await unseenInDatabase();
  const bell = page.getByRole('link', { name: /^Notices, / });
  await expect(bell).toHaveAccessibleName(bellLabel(before));
  const asked: string[] = [];
  page.on('request', (request) => {
    if (new URL(request.url()).pathname === '/api/notices/unseen') asked.push(request.method());
  });

  // A notice arrives while the page is open; the window comes back into view: the count follows.
  await tell('Live bell: back in view');
  await page.evaluate(() => window.dispatchEvent(new Event('focus')));
  await expect(bell).toHaveAccessibleName(bellLabel(before + 1));
  await expect(page.getByTestId('notice-count')).toHaveText(String(before + 1));

  // Another arrives; nothing is done in the page but time passing: the timer brings it.
  await tell('Live bell: on the timer');
  await page.clock.runFor(31_000);
  await expect(bell).toHaveAccessibleName(bellLabel(before + 2));
  expect(asked.length).toBeGreaterThanOrEqual(2);
  expect(page.url()).toMatch(/\/$/);
  await shoot(page, 'notice-bell-live');

  await queryOne(`update notices set seen_at = now() where title like 'Live bell: %' and seen_at is null`);
  await page.evaluate(() => window.dispatchEvent(new Event('focus')));
  await expect(bell).toHaveAccessibleName(bellLabel(before));
  await context.close();
});
