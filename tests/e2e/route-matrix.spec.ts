import { randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { expect, test, type APIRequestContext, type APIResponse, type Browser } from '@playwright/test';
import pg from 'pg';
import {
  ACTION_CASES,
  ROUTE_CASES,
  SUBJECTS,
  type ActionCase,
  type Body,
  type Ids,
  type Outcome,
  type RouteCase,
  type Subject,
  type Table,
} from './route-cases';
import { DEMO, freshPotassiumExport, signIn } from './support';

// The authorisation matrix: every entry point of the app (pages, each method of each route handler, each
// server action) × every actor (route-cases.ts). Route handlers and actions are called over HTTP as a
// browser calls them; a refused call sends a request the entry point would act on, and the tables it
// writes (and the audit trail) must count the same before and after. The answers as observed go to
// test-output/route-matrix.txt, the time of each call to test-output/route-matrix-timings.txt.

const METHOD_EXPORT =
  /export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\b/g;
const NAMED_EXPORT = /export\s+(?:const|let|async\s+function|function)\s+(\w+)/g;
const FOREIGN_ORIGIN = 'https://elsewhere.example';

/** The matrix's own accounts; each has the chemist's demo password (its hash is copied). */
const READER_EMAIL = 'matrix-reader@gatewell.test';
const ENDED_EMAIL = 'matrix-ended@gatewell.test';
const FIRST_EMAIL = 'matrix-first-sign-in@gatewell.test';

/** Every page and route handler method under app/, as "PAGE /path" or "METHOD /path" with [params] kept. */
function discoverRoutes(dir = 'app', segments: string[] = []): string[] {
  const found: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) {
      if (entry.name.startsWith('_')) continue;
      const isGroup = entry.name.startsWith('(') && entry.name.endsWith(')');
      found.push(...discoverRoutes(full, isGroup ? segments : [...segments, entry.name]));
    } else if (/^page\.(tsx|ts|jsx|js)$/.test(entry.name)) {
      found.push(`PAGE /${segments.join('/')}`);
    } else if (/^route\.(ts|js)$/.test(entry.name)) {
      for (const match of readFileSync(full, 'utf8').matchAll(METHOD_EXPORT))
        found.push(`${match[1]} /${segments.join('/')}`);
    }
  }
  return found.sort();
}

/** Every source file under a folder. */
function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'node_modules' ? [] : sourceFiles(full);
    return /\.(ts|tsx|js|jsx)$/.test(entry.name) ? [full] : [];
  });
}

/**
 * Every server action, as "file#export": each export of a module that starts with 'use server'. A
 * 'use server' inside a function (an inline action) is listed as "file#inline", which has no row.
 */
function discoverActions(): string[] {
  const found: string[] = [];
  for (const file of ['app', 'lib', 'components'].flatMap(sourceFiles)) {
    const text = readFileSync(file, 'utf8');
    const code = text.replace(/^(\s*(\/\/[^\n]*|\/\*[\s\S]*?\*\/))*\s*/, '');
    const moduleLevel = /^['"]use server['"]/.test(code);
    if (moduleLevel) for (const match of code.matchAll(NAMED_EXPORT)) found.push(`${file}#${match[1]}`);
    const directives = [...text.matchAll(/['"]use server['"]/g)].length;
    if (directives > (moduleLevel ? 1 : 0)) found.push(`${file}#inline`);
  }
  return found.sort();
}

interface ActionTarget {
  id: string;
  /** A page whose bundle holds the action, with [params] kept. */
  page: string;
}

/** The build's own ids of the server actions (the server-reference manifest), by "file#export". */
function builtActions(): Map<string, ActionTarget> {
  const dist = process.env.GATEWELL_DIST_DIR ?? '.next';
  const manifest = JSON.parse(
    readFileSync(path.join(dist, 'server/server-reference-manifest.json'), 'utf8'),
  ) as {
    node: Record<string, { filename: string; exportedName: string; workers: Record<string, unknown> }>;
  };
  const found = new Map<string, ActionTarget>();
  for (const [id, entry] of Object.entries(manifest.node)) {
    const pages = Object.keys(entry.workers)
      .filter((worker) => worker.endsWith('/page'))
      .map((worker) => ({
        open: worker.startsWith('app/(auth)/'),
        path:
          '/' +
          worker
            .slice('app/'.length, -'/page'.length)
            .split('/')
            .filter((segment) => segment && !segment.startsWith('('))
            .join('/'),
      }))
      // A page open to anonymous visitors first, then the one with fewest params, then the shortest.
      .sort(
        (a, b) =>
          Number(b.open) - Number(a.open) ||
          a.path.split('[').length - b.path.split('[').length ||
          a.path.length - b.path.length,
      );
    found.set(`${entry.filename}#${entry.exportedName}`, { id, page: pages[0]!.path });
  }
  return found;
}

const fill = (pattern: string, ids: Record<string, string>) =>
  pattern.replace(/\[(\w+)\]/g, (_, name: string) => ids[name] ?? randomUUID());

/** How the test reads the database the server writes (the app's role, as the server has). */
class Counter {
  private constructor(private readonly client: pg.Client) {}

  static async open(): Promise<Counter> {
    const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await client.connect();
    return new Counter(client);
  }

  async one<Row>(sql: string, values: unknown[] = []): Promise<Row> {
    const result = await this.client.query(sql, values);
    return result.rows[0] as Row;
  }

  /** The rows of each table (always with the audit trail), as one line to compare. */
  async counts(tables: readonly Table[]): Promise<string> {
    const names = [...new Set<Table>(['audit_events', ...tables])].sort();
    const row = await this.one<Record<string, string>>(
      `select ${names.map((name) => `(select count(*) from ${name}) as ${name}`).join(', ')}`,
    );
    return names.map((name) => `${name}=${row[name]}`).join(' ');
  }

  close = () => this.client.end();
}

/**
 * The matrix's accounts, from the chemist's password hash: one with no role, one whose session will have
 * ended, and an admin whose password an admin set (not yet its owner's own; admins get no sign-off
 * notices, so later tests' mail is not changed). They are disabled again when the matrix ends.
 */
async function ensureAccounts(counter: Counter): Promise<void> {
  for (const [email, name, adminSet] of [
    [READER_EMAIL, 'Matrix Reader', false],
    [ENDED_EMAIL, 'Matrix Ended', false],
    [FIRST_EMAIL, 'Matrix First Sign-in', true],
  ] as const) {
    await counter.one(
      `insert into users (email, name, password_hash, password_change_required)
       select $1, $2, password_hash, $4 from users where email = $3
       on conflict (email) do update set disabled_at = null, password_change_required = excluded.password_change_required`,
      [email, name, DEMO.chemist.email, adminSet],
    );
  }
  await counter.one(
    `insert into user_roles (user_id, role) select id, 'admin' from users where email = $1 on conflict do nothing`,
    [FIRST_EMAIL],
  );
  // The accounts a grid-layout call refuses each keep a layout: a refused DELETE must leave it there.
  await counter.one(
    `insert into user_grid_layouts (user_id, grid, columns)
     select id, 'plate-wells', '[{"id": "position", "hidden": false, "width": 90}]'::jsonb
       from users where email = any($1)
     on conflict (user_id, grid) do nothing`,
    [[ENDED_EMAIL, FIRST_EMAIL]],
  );
}

const disableAccounts = (counter: Counter) =>
  counter.one(`update users set disabled_at = now() where email = any($1)`, [
    [READER_EMAIL, ENDED_EMAIL, FIRST_EMAIL],
  ]);

async function idsOf(counter: Counter): Promise<Ids & Record<string, string>> {
  const ids = await counter.one<Ids & Record<string, string>>(
    `with plate as (select id from plates where state = 'imported' order by imported_at limit 1),
          fit as (select compound_id, target_id from fits where plate_id = (select id from plate) limit 1),
          compound as (select id, identifier from compounds order by identifier limit 1),
          screen as (select id, name from screens order by name limit 1)
     select (select id from plate) as "plateId",
            (select id from wells where plate_id = (select id from plate) limit 1) as "wellId",
            (select compound_id from fit) as "fitCompoundId", (select target_id from fit) as "fitTargetId",
            (select id from compound) as "compoundId", (select identifier from compound) as "compoundIdentifier",
            (select id from screen) as "screenId", (select name from screen) as "screenName",
            (select id from import_templates order by name limit 1) as "templateId",
            (select id from users where email = $1) as "userId"`,
    [READER_EMAIL],
  );
  for (const [key, value] of Object.entries(ids)) expect(value, `demo data holds a ${key}`).toBeTruthy();
  return { ...ids, grid: 'plate-wells', readerEmail: READER_EMAIL, password: DEMO.chemist.password };
}

const ACCOUNTS: Record<Exclude<Subject, 'anonymous'>, { email: string; password: string }> = {
  ended: { email: ENDED_EMAIL, password: DEMO.chemist.password },
  'no-role': { email: READER_EMAIL, password: DEMO.chemist.password },
  'first-sign-in': { email: FIRST_EMAIL, password: DEMO.chemist.password },
  chemist: DEMO.chemist,
  biologist: DEMO.biologist,
  approver: DEMO.approver,
  admin: DEMO.admin,
};

/** One signed-in context per actor; "ended" signs in, then its account's sessions end (as sign-out elsewhere does). */
async function clientFor(browser: Browser, subject: Subject, counter: Counter): Promise<APIRequestContext> {
  const context = await browser.newContext();
  if (subject === 'anonymous') return context.request;
  await signIn(await context.newPage(), ACCOUNTS[subject].email, ACCOUNTS[subject].password);
  if (subject === 'ended')
    await counter.one(`update users set session_version = session_version + 1 where email = $1`, [
      ENDED_EMAIL,
    ]);
  return context.request;
}

function sendRoute(
  client: APIRequestContext,
  method: string,
  url: string,
  origin: string | null,
  body?: Body,
): Promise<APIResponse> {
  if (method === 'GET' || method === 'PAGE') return client.get(url, { maxRedirects: 0 });
  const headers: Record<string, string> = origin ? { origin } : {};
  if (body && 'json' in body) return client.fetch(url, { method, maxRedirects: 0, headers, data: body.json });
  return client.fetch(url, { method, maxRedirects: 0, headers, multipart: body?.multipart ?? {} });
}

/**
 * Calls a server action as React does from a form: POST to a page holding it, the action's id in the
 * Next-Action header, the arguments (the form's last state, the form) encoded as a multipart reply.
 */
function sendAction(
  client: APIRequestContext,
  target: ActionTarget,
  ids: Record<string, string>,
  form: Record<string, string>,
  origin: string,
): Promise<APIResponse> {
  const multipart: Record<string, string> = { '0': JSON.stringify([{}, '$K1']) };
  for (const [key, value] of Object.entries(form)) multipart[`1_${key}`] = value;
  return client.post(fill(target.page, ids), {
    maxRedirects: 0,
    headers: { 'next-action': target.id, accept: 'text/x-component', origin },
    multipart,
  });
}

function checkRoute(
  response: APIResponse,
  outcome: Outcome,
  label: string,
  isPage: boolean,
  letIn?: number,
): void {
  const status = response.status();
  const location = response.headers()['location'] ?? '';
  if (outcome === 'sign-in') {
    expect([302, 303, 307], label).toContain(status);
    expect(location, label).toMatch(/\/sign-in(\?|$)/);
  } else if (outcome === 'home' || outcome === 'account') {
    expect([302, 303, 307], label).toContain(status);
    expect(new URL(location, 'http://x').pathname, label).toBe(outcome === 'home' ? '/' : '/account');
  } else if (outcome === 200 && !isPage && letIn !== undefined) {
    expect(status, `${label}: let in, the row's exact answer`).toBe(letIn);
  } else if (outcome === 200 && !isPage) {
    // Let in: past sign-in and roles. A changing request's empty body is then refused as invalid (4xx).
    expect(status, `${label}: got past sign-in and role checks`).not.toBe(401);
    expect(status, label).not.toBe(403);
    expect(status, label).toBeLessThan(500);
    expect([301, 302, 303, 307, 308], `${label}: not redirected`).not.toContain(status);
  } else {
    expect(status, label).toBe(outcome);
  }
}

const SESSION_ENDED = 'Your session has ended. Sign in again.';
const ROLE_REFUSED = /This needs the [a-z ]+ role\./;
const OWN_PASSWORD_FIRST = /choose your own on the Account page/;

async function checkAction(response: APIResponse, outcome: Outcome, label: string): Promise<string> {
  const status = response.status();
  const location = response.headers()['location'] ?? '';
  const actionRedirect = response.headers()['x-action-redirect'] ?? '';
  const text = status === 200 ? await response.text() : '';
  const seen = `${status} ${location || actionRedirect} ${
    text.includes(SESSION_ENDED)
      ? '(session ended)'
      : OWN_PASSWORD_FIRST.test(text)
        ? '(own password first)'
        : (ROLE_REFUSED.exec(text)?.[0] ?? '')
  }`;
  if (outcome === 'sign-in') {
    // The proxy's redirect (anonymous), or the action's own (sign-out).
    if (status === 200) expect(actionRedirect, label).toMatch(/^\/sign-in(\?|;|$)/);
    else {
      expect([302, 303, 307], label).toContain(status);
      expect(location, label).toMatch(/\/sign-in(\?|$)/);
    }
    return seen;
  }
  expect(status, label).toBe(200);
  expect(response.headers()['content-type'], `${label}: an action's answer`).toContain('text/x-component');
  if (outcome === 401) expect(text, label).toContain(SESSION_ENDED);
  else if (outcome === 403) {
    expect(text, label).toMatch(label.startsWith('first-sign-in ') ? OWN_PASSWORD_FIRST : ROLE_REFUSED);
    expect(text, label).not.toContain(SESSION_ENDED);
  } else if (outcome === 200) {
    // The action ran and answered its form state (an empty form: the fields it wants), or redirected.
    if (!actionRedirect)
      expect(text, `${label}: the action's form state`).toMatch(/"(message|fieldErrors)":/);
    expect(text, `${label}: got past sign-in and role checks`).not.toMatch(ROLE_REFUSED);
    expect(text, label).not.toMatch(OWN_PASSWORD_FIRST);
    expect(text, label).not.toContain(SESSION_ENDED);
  }
  return seen;
}

/** The actor a cross-site row borrows: one the entry point lets in, so that only the origin refuses it. */
function allowedActor(expectations: Record<Subject, Outcome>): Exclude<Subject, 'anonymous'> {
  const subject = SUBJECTS.find(
    (s) => s !== 'anonymous' && s !== 'ended' && s !== 'first-sign-in' && expectations[s] === 200,
  );
  return (subject ?? 'admin') as Exclude<Subject, 'anonymous'>;
}

test('every page, route handler method and server action has a row in the matrix', () => {
  expect(ROUTE_CASES.map((c) => c.route).sort()).toEqual(discoverRoutes());
  const actions = discoverActions();
  expect(ACTION_CASES.map((c) => c.action).sort()).toEqual(actions);
  // The build holds exactly these actions (an inline one would show here too).
  expect([...builtActions().keys()].sort()).toEqual(actions);
});

test('authorisation matrix: every entry point × every actor, nothing written when refused', async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(480_000);
  const counter = await Counter.open();
  const origin = baseURL!;
  const targets = builtActions();
  const seen: string[] = [];
  let cells = 0;
  const timings: [number, string][] = [];
  try {
    await ensureAccounts(counter);
    // Jobs queued before the matrix (fits, forecasts, imports of earlier tests) write from the worker; the
    // matrix counts rows, so it starts once the queue is idle.
    await expect
      .poll(
        async () =>
          (
            await counter.one<{ open: string }>(
              `select count(*) as open from compute_jobs where state in ('queued', 'running')`,
            )
          ).open,
        { message: 'the job queue is idle', timeout: 120_000 },
      )
      .toBe('0');
    const ids = await idsOf(counter);
    const file = () => ({ name: 'matrix-plate.csv', mimeType: 'text/csv', buffer: freshPotassiumExport() });
    const clients = new Map<Subject, APIRequestContext>();
    for (const subject of SUBJECTS) clients.set(subject, await clientFor(browser, subject, counter));

    /** Calls one cell; a refused call must leave the tables it writes as they were. */
    const cell = async (
      subject: Subject | 'cross-site' | 'no-origin',
      entry: string,
      expected: Outcome,
      writes: readonly Table[] | undefined,
      call: () => Promise<APIResponse>,
      check: (response: APIResponse, label: string) => Promise<string>,
    ) => {
      const label = `${subject} ${entry}`;
      const refused = expected !== 200 && expected !== 'home';
      const before = refused && writes ? await counter.counts(writes) : '';
      const started = Date.now();
      const observed = await check(await call(), label);
      timings.push([Date.now() - started, label]);
      if (refused && writes) expect(await counter.counts(writes), `${label}: nothing written`).toBe(before);
      seen.push(`${subject.padEnd(10)} ${entry.padEnd(70)} ${observed}`);
      cells += 1;
    };

    // A call that is let in names no real template: DELETE needs no body, and the demo's templates stay.
    const letInIds = { ...ids, templateId: randomUUID() };
    const routeCall = (
      client: APIRequestContext,
      routeCase: RouteCase,
      refused: boolean,
      from: string | null = origin,
    ) => {
      const [method, pattern] = routeCase.route.split(' ') as [string, string];
      const url = fill(pattern, refused ? ids : letInIds);
      return sendRoute(client, method, url, from, refused ? routeCase.body?.(ids, file) : undefined);
    };
    const routeCheck = (outcome: Outcome, letIn?: number) => async (response: APIResponse, label: string) => {
      checkRoute(response, outcome, label, label.includes(' PAGE '), letIn);
      return `${response.status()} ${response.headers()['location'] ?? ''}`;
    };
    // Refused for its origin (the actor is let in otherwise), before the body is read.
    const originRefused = async (response: APIResponse, label: string) => {
      expect(response.status(), label).toBe(403);
      expect(await response.json(), label).toMatchObject({ error: 'forbidden', message: /Origin header/ });
      return '403 (origin)';
    };
    const actionCall = (client: APIRequestContext, actionCase: ActionCase, refused: boolean, from = origin) =>
      sendAction(client, targets.get(actionCase.action)!, ids, refused ? actionCase.form(ids) : {}, from);

    const signOut = ACTION_CASES.find((c) => c.action.endsWith('#signOutAction'))!;
    for (const subject of SUBJECTS) {
      const client = clients.get(subject)!;
      for (const routeCase of ROUTE_CASES) {
        const expected = routeCase.expect[subject];
        const refused = expected !== 200 && expected !== 'home';
        await cell(
          subject,
          routeCase.route,
          expected,
          routeCase.writes ?? [],
          () => routeCall(client, routeCase, refused),
          routeCheck(expected, routeCase.letIn),
        );
      }
      for (const actionCase of ACTION_CASES) {
        if (actionCase === signOut) continue;
        const expected = actionCase.expect[subject];
        await cell(
          subject,
          `ACTION ${actionCase.action}`,
          expected,
          actionCase.writes,
          () => actionCall(client, actionCase, expected !== 200),
          (response, label) => checkAction(response, expected, label),
        );
        // The action refuses before it reads the form (its own check, not only the service's after
        // parsing): an empty form gets the same refusal, not the fields it lacks.
        if (expected === 401 || expected === 403)
          await cell(
            subject,
            `ACTION ${actionCase.action} (empty form)`,
            expected,
            actionCase.writes,
            () => actionCall(client, actionCase, false),
            (response, label) => checkAction(response, expected, label),
          );
      }
    }

    // Cross-site: a signed-in actor the entry point lets in, sending a request it would act on, from a
    // page elsewhere. Route handlers refuse it themselves (withUser); Next refuses actions from a foreign
    // Origin before running them (500).
    for (const routeCase of ROUTE_CASES.filter((c) => !/^(GET|PAGE) /.test(c.route))) {
      const client = clients.get(allowedActor(routeCase.expect))!;
      await cell(
        'cross-site',
        routeCase.route,
        403,
        routeCase.writes ?? [],
        () => routeCall(client, routeCase, true, FOREIGN_ORIGIN),
        originRefused,
      );
      await cell(
        'no-origin',
        routeCase.route,
        403,
        routeCase.writes ?? [],
        () => routeCall(client, routeCase, true, null),
        originRefused,
      );
    }
    for (const actionCase of ACTION_CASES) {
      const client = clients.get(allowedActor(actionCase.expect))!;
      await cell(
        'cross-site',
        `ACTION ${actionCase.action}`,
        403,
        actionCase.writes,
        () => actionCall(client, actionCase, true, FOREIGN_ORIGIN),
        async (response, label) => {
          expect(response.status(), `${label}: Next refuses a foreign Origin`).toBe(500);
          expect(response.headers()['x-action-redirect'], label).toBeUndefined();
          return `${response.status()}`;
        },
      );
    }

    // Last, sign-out for each actor: everyone ends at sign-in, and a signed-in session is over afterwards.
    for (const subject of SUBJECTS) {
      const client = clients.get(subject)!;
      await cell(
        subject,
        `ACTION ${signOut.action}`,
        signOut.expect[subject],
        // Signing out is no refusal: it writes its own audit event, so nothing is counted here.
        undefined,
        () => actionCall(client, signOut, false),
        (response, label) => checkAction(response, signOut.expect[subject], label),
      );
      const after = await client.get('/api/import-templates');
      expect(after.status(), `${subject}: signed out`).toBe(401);
    }

    const entries = ROUTE_CASES.length + ACTION_CASES.length;
    const summary = `authorisation matrix: ${entries} entry points (${ROUTE_CASES.length} pages and route handler methods, ${ACTION_CASES.length} server actions) × ${SUBJECTS.length} actors, and a cross-site row: ${cells} calls`;
    console.log(summary);
    test.info().annotations.push({ type: 'matrix', description: summary });
    mkdirSync('test-output', { recursive: true });
    writeFileSync('test-output/route-matrix.txt', `${summary}\n${seen.join('\n')}\n`);
    writeFileSync(
      'test-output/route-matrix-timings.txt',
      timings
        .sort((a, b) => b[0] - a[0])
        .map(([ms, l]) => `${ms} ${l}`)
        .join('\n'),
    );
  } finally {
    await disableAccounts(counter);
    await counter.close();
  }
});
