// Takes full-page screenshots of Gatewell pages as a signed-in demo user, to look at what people see.
// Usage: node scripts/screenshots.mjs [--user biologist] [--base http://127.0.0.1:4310] [--width 1280] /plates /compounds …
// Writes test-output/screenshots/look-<path>.png. Uses Debian's /usr/bin/chromium.
import { mkdirSync } from 'node:fs';
import { chromium } from '@playwright/test';

const args = process.argv.slice(2);
const option = (name, fallback) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args.splice(i, 2)[1] : fallback;
};
const user = option('user', 'biologist');
const base = option('base', 'http://127.0.0.1:4310');
const width = Number(option('width', '1280'));
const paths = args.length ? args : ['/'];

mkdirSync('test-output/screenshots', { recursive: true });
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
  args: [
    '--disable-gpu',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    '--no-first-run',
  ],
});
const page = await browser.newPage({ viewport: { width, height: 900 } });
await page.goto(`${base}/sign-in`);
await page.getByLabel('E-mail').fill(`${user}@gatewell.test`);
await page.getByLabel('Password').fill(`demo-${user}-pass`);
await page.getByRole('button', { name: 'Sign in' }).click();
await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
for (const path of paths) {
  await page.goto(`${base}${path}`);
  await page.waitForLoadState('load');
  await page.waitForTimeout(2500);
  const file = `test-output/screenshots/look-${user}-${path.replace(/[^a-z0-9]+/gi, '_') || 'home'}-${width}.png`;
  await page.screenshot({ path: file, fullPage: true });
  console.log(file);
}
await browser.close();
