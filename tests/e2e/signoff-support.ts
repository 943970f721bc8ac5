import type { Browser, Page } from '@playwright/test';
import { DEMO, queryOne, screenshot, signedInContext, type DemoRole } from './support';

// The sign-off tests' names for the shared e2e helpers (tests/e2e/support.ts): the demo people, one row
// from the database, a full-page screenshot.
export const PEOPLE = DEMO;
export type Person = DemoRole;

/** A browser context of its own, signed in through the sign-in form as one demo person. */
export async function signedIn(browser: Browser, who: Person): Promise<Page> {
  return (await signedInContext(browser, who)).page;
}

export const dbRow = queryOne;
export const shot = screenshot;
