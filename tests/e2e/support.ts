import { createHash, randomBytes } from 'node:crypto';
import * as XLSX from 'xlsx';
import { readFileSync } from 'node:fs';
import { expect, type Browser, type BrowserContext, type Page, type Request } from '@playwright/test';
import pg from 'pg';

// Demo accounts from seeders/20261201000100-demo-users.js (passwords for the local demo only).
export const DEMO = {
  admin: { email: 'admin@gatewell.test', password: 'demo-admin-pass' },
  chemist: { email: 'chemist@gatewell.test', password: 'demo-chemist-pass' },
  biologist: { email: 'biologist@gatewell.test', password: 'demo-biologist-pass' },
  approver: { email: 'approver@gatewell.test', password: 'demo-approver-pass' },
  approver2: { email: 'approver2@gatewell.test', password: 'demo-approver2-pass' },
} as const;

export type DemoRole = keyof typeof DEMO;

/** Signs in through the sign-in form and waits for the signed-in shell. */
export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
}

/** A fresh browser context signed in as a demo user. */
export async function signedInContext(
  browser: Browser,
  role: DemoRole,
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, DEMO[role].email, DEMO[role].password);
  return { context, page };
}

/** Reads one value from the test database the built app runs on (DATABASE_URL from scripts/test.sh). */
export async function queryOne<Row>(sql: string, values: unknown[] = []): Promise<Row | undefined> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const result = await client.query(sql, values);
    return result.rows[0] as Row | undefined;
  } finally {
    await client.end();
  }
}

export const screenshot = (page: Page, name: string) =>
  page.screenshot({ path: `test-output/screenshots/${name}.png`, fullPage: true });

/**
 * The demo potassium export made new for one import: 64 trailing blank lines, each ended by LF or CRLF
 * as random bits pick (blank lines are skipped on import), so its bytes and SHA-256 differ from every
 * other import of the run; two draws agree once in 2^64.
 */
export function freshPotassiumExport(): Buffer {
  const text = readFileSync('seeders/data/demo-plates/kv-96-plate-01.csv', 'utf8').trimEnd();
  const bits = [...randomBytes(8)].flatMap((byte) =>
    Array.from({ length: 8 }, (_, bit) => (byte >> bit) & 1),
  );
  return Buffer.from(`${text}\n${bits.map((bit) => (bit ? '\r\n' : '\n')).join('')}`, 'utf8');
}

/** One import step a page posted (inspect, preview, commit) and its request. */
export interface ImportStepSent {
  step: string;
  request: Request;
}

/** Records the import steps the page posts from now on. */
export function watchImportSteps(page: Page): ImportStepSent[] {
  const sent: ImportStepSent[] = [];
  page.on('request', (request) => {
    const step = /^\/api\/imports\/(inspect|preview|commit)$/.exec(new URL(request.url()).pathname)?.[1];
    if (step && request.method() === 'POST') sent.push({ step, request });
  });
  return sent;
}

/**
 * Checks that an import sent its file once: preview's and commit's bodies (smaller than the file) named
 * one draft and held no file, and that draft holds the file's SHA-256 and size (inspect sent it: Chromium
 * does not show a file's body to the test) and was used by the plate with the label.
 */
export async function expectOneReadImport(
  sent: ImportStepSent[],
  label: string,
  file: Buffer,
): Promise<void> {
  expect(sent.map((s) => s.step)).toEqual(['inspect', 'preview', 'commit']);
  const drafts = await Promise.all(
    sent.slice(1).map(async ({ request }) => {
      const body = request.postData() ?? '';
      expect(body).not.toContain('name="file"');
      expect((await request.sizes()).requestBodySize).toBeLessThan(file.length);
      return /name="draftId"\r\n\r\n([0-9a-f-]{36})\r\n/.exec(body)?.[1];
    }),
  );
  expect(drafts[0]).toMatch(/^[0-9a-f-]{36}$/);
  expect(drafts[1]).toBe(drafts[0]);
  const draft = await queryOne<{
    label: string;
    sha256: string;
    size: number;
    used: boolean;
    sheets: boolean;
  }>(
    `select p.label, d.sha256, d.size_bytes as size, d.consumed_at is not null as used, d.sheets is not null as sheets
       from import_drafts d join plates p on p.id = d.plate_id where d.id = $1`,
    [drafts[0]],
  );
  expect(draft).toEqual({
    label,
    sha256: createHash('sha256').update(file).digest('hex'),
    size: file.length,
    used: true,
    sheets: false,
  });
}

/** The rows of a downloaded csv file as cells, read by SheetJS (quoted commas and line breaks kept in their cell). */
export function csvCells(text: string): string[][] {
  const book = XLSX.read(text, { type: 'string', raw: true });
  return XLSX.utils.sheet_to_json<string[]>(book.Sheets[book.SheetNames[0]!]!, {
    header: 1,
    raw: false,
    defval: '',
    blankrows: false,
  });
}

/** The audit download's header row, as a person reads it (written out here, not taken from the app). */
export const AUDIT_EXPORT_HEADER = [
  'Event',
  'Time (UTC)',
  'Local time (UTC)',
  'Person',
  'Roles now',
  'E-mail',
  'What happened',
  'Kind of object',
  'Object',
  'Changes',
  'Action',
  'Record type',
  'Record id',
  'Reason',
  'Before',
  'After',
  'Address',
] as const;

/**
 * Every main page an admin can open, on the demo data: lists, a plate (NAV-P02) with its tabs, a compound
 * with its profile, a screen, a person, the outbox, the audit trail, the account page and the notices. The import page
 * is the biologist's and is not in this list.
 */
export async function mainPages(): Promise<{ pages: string[]; plate: { id: string } }> {
  const plate = await queryOne<{ id: string }>(`select id from plates where label = 'NAV-P02'`);
  const compound = await queryOne<{ id: string }>(
    `select compound_id as id from wells where plate_id = $1 and compound_id is not null limit 1`,
    [plate!.id],
  );
  const screen = await queryOne<{ id: string }>('select screen_id as id from plates where id = $1', [
    plate!.id,
  ]);
  const user = await queryOne<{ id: string }>(`select id from users where email = 'biologist@gatewell.test'`);
  const pages = [
    '/',
    '/plates',
    `/plates/${plate!.id}`,
    `/plates/${plate!.id}/fits`,
    `/plates/${plate!.id}/forecast`,
    `/plates/${plate!.id}/history`,
    '/compounds',
    `/compounds/${compound!.id}`,
    `/compounds/${compound!.id}/profile`,
    '/screens',
    `/screens/${screen!.id}`,
    '/screens/new',
    '/admin/users',
    '/admin/users/new',
    `/admin/users/${user!.id}`,
    '/admin/outbox',
    '/audit',
    '/account',
    '/notices',
  ];
  return { pages, plate: plate! };
}

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/gi;
/** What an internal id looks like on a screen: UUIDs, worker names (host:pid), process ids, long hex. */
const ID_PATTERNS: [string, RegExp][] = [
  ['UUID', UUID],
  ['worker name', /\b[a-z][a-z0-9-]*:\d{2,}\b/g],
  ['process id', /\bpid\b/gi],
  ['long hex', /\b[0-9a-f]{20,}\b/gi],
];

/** Every id-shaped piece of the page's rendered text, with what it looked like. */
export async function idsOnPage(page: Page): Promise<string[]> {
  const text = await page.locator('body').innerText();
  return ID_PATTERNS.flatMap(([what, pattern]) => [...text.matchAll(pattern)].map((m) => `${what}: ${m[0]}`));
}

/** A full-page screenshot at 1440×900 and at 1024×768 in test-output/screenshots/, then back to the default size. */
export async function shootAtTwoSizes(page: Page, name: string) {
  for (const [width, height] of [
    [1440, 900],
    [1024, 768],
  ] as const) {
    await page.setViewportSize({ width, height });
    await page.waitForTimeout(300); // the grids lay out again at the new width
    await page.screenshot({ path: `test-output/screenshots/${name}-${width}x${height}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1280, height: 860 });
}

/** Waits (up to 90 s) until the plate's fits are no longer pending, as the plate's page asks the API. */
export async function fitsSettled(page: Page, plateId: string): Promise<void> {
  await expect
    .poll(
      async () =>
        ((await (await page.request.get(`/api/plates/${plateId}/fits`)).json()) as { fitsPending: boolean })
          .fitsPending,
      { timeout: 90_000, intervals: [500, 1000] },
    )
    .toBe(false);
}
