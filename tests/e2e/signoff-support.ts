import { expect, type Browser, type Page } from '@playwright/test';
import pg from 'pg';

// Demo accounts from seeders/20261201000100-demo-users.js (passwords for the local demo only).
export const PEOPLE = {
  admin: { email: 'admin@gatewell.test', password: 'demo-admin-pass' },
  chemist: { email: 'chemist@gatewell.test', password: 'demo-chemist-pass' },
  biologist: { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' },
  approver: { email: 'approver@gatewell.test', password: 'demo-approver-pass' },
  approver2: { email: 'approver2@gatewell.test', password: 'demo-approver2-pass' },
} as const;

export type Person = keyof typeof PEOPLE;

/** A browser context of its own, signed in through the sign-in form as one demo person. */
export async function signedIn(browser: Browser, who: Person): Promise<Page> {
  const page = await (await browser.newContext()).newPage();
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(PEOPLE[who].email);
  await page.getByLabel('Password', { exact: true }).fill(PEOPLE[who].password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  return page;
}

/** One row from the database the built app runs on (DATABASE_URL from scripts/test.sh). */
export async function dbRow<Row>(sql: string, values: unknown[] = []): Promise<Row | undefined> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    return (await client.query(sql, values)).rows[0] as Row | undefined;
  } finally {
    await client.end();
  }
}

export const shot = (page: Page, name: string) => page.screenshot({ path: `test-output/screenshots/${name}.png`, fullPage: true });
