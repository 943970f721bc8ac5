import { randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { expect, test, type APIRequestContext, type APIResponse, type Browser } from '@playwright/test';
import { ROUTE_CASES, SUBJECTS, type Outcome, type Subject } from './route-cases';
import { DEMO, queryOne, signIn } from './support';

const METHOD_EXPORT = /export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g;

/** Every page and route handler under app/, as "PAGE /path" or "METHOD /path" with [params] kept. */
function discoverRoutes(dir = 'app', segments: string[] = []): string[] {
  const found: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) {
      if (entry.name.startsWith('_')) continue;
      const isGroup = entry.name.startsWith('(') && entry.name.endsWith(')');
      found.push(...discoverRoutes(full, isGroup ? segments : [...segments, entry.name]));
    } else if (entry.name === 'page.tsx') {
      found.push(`PAGE /${segments.join('/')}`);
    } else if (entry.name === 'route.ts') {
      for (const match of readFileSync(full, 'utf8').matchAll(METHOD_EXPORT))
        found.push(`${match[1]} /${segments.join('/')}`);
    }
  }
  return found.sort();
}

async function clientFor(browser: Browser, subject: Subject): Promise<APIRequestContext> {
  const context = await browser.newContext();
  if (subject !== 'anonymous')
    await signIn(await context.newPage(), DEMO[subject].email, DEMO[subject].password);
  return context.request;
}

async function send(
  client: APIRequestContext,
  method: string,
  url: string,
  baseURL: string,
): Promise<APIResponse> {
  if (method === 'GET' || method === 'PAGE') return client.get(url, { maxRedirects: 0 });
  // Changing requests come from our own page (Origin) with an empty body: past the guards, the handler refuses the body.
  return client.fetch(url, { method, maxRedirects: 0, headers: { origin: baseURL }, multipart: {} });
}

function check(response: APIResponse, outcome: Outcome, label: string): void {
  const status = response.status();
  const location = response.headers()['location'] ?? '';
  if (outcome === 'sign-in') {
    expect([302, 303, 307], label).toContain(status);
    expect(location, label).toMatch(/\/sign-in(\?|$)/);
  } else if (outcome === 'home') {
    expect([302, 303, 307], label).toContain(status);
    expect(new URL(location, 'http://x').pathname, label).toBe('/');
  } else if (outcome === 'passes') {
    expect(status, `${label}: got past sign-in and role checks`).not.toBe(401);
    expect(status, label).not.toBe(403);
    expect(status, label).toBeLessThan(500);
  } else {
    expect(status, label).toBe(outcome);
  }
}

test('every page and API route has a row in the role matrix', () => {
  expect(ROUTE_CASES.map((c) => c.route).sort()).toEqual(discoverRoutes());
});

test('role × route matrix: anonymous and each role are let in, sent to sign-in, or refused', async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(180_000);
  // Real records of the demo data, so that allowed reads answer with content rather than "not found".
  const ids = (await queryOne<Record<string, string>>(
    `select (select id from users where email = $1) as "userId", (select id from plates order by imported_at limit 1) as "plateId",
            (select id from compounds order by identifier limit 1) as "compoundId", (select id from screens order by name limit 1) as "screenId"`,
    [DEMO.admin.email],
  ))!;
  const seen: string[] = [];
  for (const subject of SUBJECTS) {
    const client = await clientFor(browser, subject);
    for (const routeCase of ROUTE_CASES) {
      const [method, pattern] = routeCase.route.split(' ') as [string, string];
      const url = pattern.replace(/\[(\w+)\]/g, (_, name: string) => ids[name] ?? randomUUID());
      const response = await send(client, method, url, baseURL!);
      seen.push(
        `${subject.padEnd(9)} ${routeCase.route.padEnd(44)} ${response.status()} ${response.headers()['location'] ?? ''}`,
      );
      check(response, routeCase.expect[subject], `${subject} ${method} ${url}`);
    }
  }
  // The answers as observed, for reviewers: test-output/route-matrix.txt.
  mkdirSync('test-output', { recursive: true });
  writeFileSync('test-output/route-matrix.txt', `${seen.join('\n')}\n`);
});

test('a changing API request without our Origin is refused before anything else', async ({
  request,
  baseURL,
}) => {
  const changing = ROUTE_CASES.filter((c) => !c.route.startsWith('GET') && !c.route.startsWith('PAGE'));
  for (const routeCase of changing) {
    const [method, url] = routeCase.route.split(' ') as [string, string];
    const foreign = await request.fetch(url, {
      method,
      headers: { origin: 'https://elsewhere.example' },
      multipart: {},
    });
    expect(foreign.status(), `${method} ${url} from a foreign origin`).toBe(403);
    const none = await request.fetch(url, { method, multipart: {} });
    expect(none.status(), `${method} ${url} without Origin`).toBe(403);
    expect(await none.json()).toMatchObject({ error: 'forbidden' });
  }
  void baseURL;
});
