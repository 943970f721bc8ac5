import { expect, test, type BrowserContext } from '@playwright/test';
import { sealData, unsealData } from 'iron-session';
import { dbRow, PEOPLE } from './signoff-support';

// Session fixation and expiry against the built app. Cookies are sealed here with the run's
// SESSION_SECRET (scripts/test.sh exports it) exactly as the app seals them.
const COOKIE = 'gatewell_session';
const TWELVE_HOURS = 12 * 60 * 60;

async function cookieValue(context: BrowserContext): Promise<string | undefined> {
  return (await context.cookies()).find((c) => c.name === COOKIE)?.value;
}

async function sealedFor(email: string, times: { issuedAt: number; lastSeenAt: number }) {
  const user = await dbRow<{ id: string; session_version: number }>(
    'select id, session_version from users where email = $1',
    [email],
  );
  return sealData(
    { userId: user!.id, sessionVersion: user!.session_version, ...times },
    { password: process.env.SESSION_SECRET!, ttl: TWELVE_HOURS },
  );
}

async function plant(context: BrowserContext, value: string) {
  await context.addCookies([
    { name: COOKIE, value, domain: '127.0.0.1', path: '/', httpOnly: true, sameSite: 'Lax' },
  ]);
}

test('signing in replaces whatever session cookie the browser brought, and sign-out retires it (no fixation, no replay)', async ({
  page,
  context,
}) => {
  await plant(context, 'a-value-chosen-by-someone-else');
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(PEOPLE.chemist.email);
  await page.getByLabel('Password').fill(PEOPLE.chemist.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  const first = await cookieValue(context);
  expect(first).toBeDefined();
  expect(first).not.toBe('a-value-chosen-by-someone-else');

  // After sign-out, the earlier cookie no longer opens anything, even if someone kept a copy.
  await page.getByRole('button', { name: 'Sign out' }).first().click();
  await expect(page).toHaveURL(/\/sign-in$/);
  await plant(context, first!);
  await page.goto('/plates');
  await expect(page).toHaveURL(/\/sign-in/);

  // A second sign-in in the same browser, as someone else, gets a new cookie again.
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(PEOPLE.biologist.email);
  await page.getByLabel('Password').fill(PEOPLE.biologist.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByText('Bea Biologist').first()).toBeVisible();
  expect(await cookieValue(context)).not.toBe(first);
});

test('a genuine cookie works; an idle or too old one sends the visitor to sign-in', async ({ browser }) => {
  const now = Date.now();
  const cases = [
    { name: 'fresh', times: { issuedAt: now - 60_000, lastSeenAt: now - 60_000 }, signedIn: true },
    {
      name: 'idle 31 minutes',
      times: { issuedAt: now - 40 * 60_000, lastSeenAt: now - 31 * 60_000 },
      signedIn: false,
    },
    {
      name: 'signed in 12 hours ago',
      times: { issuedAt: now - (TWELVE_HOURS * 1000 + 60_000), lastSeenAt: now - 60_000 },
      signedIn: false,
    },
  ];
  for (const c of cases) {
    const context = await browser.newContext();
    await plant(context, await sealedFor(PEOPLE.biologist.email, c.times));
    const page = await context.newPage();
    await page.goto('/plates');
    if (c.signedIn) await expect(page.getByRole('heading', { name: 'Plates' }), c.name).toBeVisible();
    else await expect(page, c.name).toHaveURL(/\/sign-in\?next=%2Fplates$/);
    await context.close();
  }
});

test('a read moves the idle clock at most once a minute, on pages (the proxy) and on the API (withUser) alike; an idle cookie gets 401 from the API', async ({
  playwright,
  baseURL,
}) => {
  const now = Date.now();
  const lastSeen = async (setCookie: string | undefined) => {
    if (!setCookie) return null;
    const value = /gatewell_session=([^;]+)/.exec(setCookie)?.[1];
    return value
      ? (
          await unsealData<{ lastSeenAt: number }>(value, {
            password: process.env.SESSION_SECRET!,
            ttl: TWELVE_HOURS,
          })
        ).lastSeenAt
      : null;
  };
  const plate = await dbRow<{ id: string }>("select id from plates where label = 'NAV-P01'");
  for (const path of ['/plates', `/api/plates/${plate!.id}/jobs`]) {
    const api = await playwright.request.newContext({ baseURL: baseURL! });
    const get = async (times: { issuedAt: number; lastSeenAt: number }) =>
      api.get(path, {
        headers: { cookie: `${COOKIE}=${await sealedFor(PEOPLE.biologist.email, times)}` },
        maxRedirects: 0,
      });

    const due = await get({ issuedAt: now - 10 * 60_000, lastSeenAt: now - 5 * 60_000 });
    expect(due.status(), path).toBe(200);
    expect(await lastSeen(due.headers()['set-cookie']), path).toBeGreaterThanOrEqual(now);

    const recent = await get({ issuedAt: now - 10 * 60_000, lastSeenAt: Date.now() - 5_000 });
    expect(recent.status(), path).toBe(200);
    expect(recent.headers()['set-cookie'], path).toBeUndefined();

    const idle = await get({ issuedAt: now - 40 * 60_000, lastSeenAt: now - 31 * 60_000 });
    expect(idle.status(), path).toBe(path.startsWith('/api/') ? 401 : 307);
    await api.dispose();
  }
});
