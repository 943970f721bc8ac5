import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { expect, type APIRequestContext } from '@playwright/test';
import { queryOne } from '../support';

/** The test run's instance name, as scripts/test.sh passes it to scripts/pg.sh and scripts/fake-smtp.sh. */
const instance = () => process.env.GATEWELL_TEST_INSTANCE ?? 'test';

/** Runs one of Gatewell's service scripts on this run's instance and fails with its own words if it fails. */
function runScript(script: 'pg.sh' | 'fake-smtp.sh', ...args: string[]): void {
  try {
    execFileSync('bash', [`scripts/${script}`, args[0]!, instance(), ...args.slice(1)], { stdio: ['ignore', 'ignore', 'pipe'], timeout: 120_000 });
  } catch (error) {
    throw new Error(`scripts/${script} ${args.join(' ')} ${instance()} failed: ${String((error as { stderr?: Buffer }).stderr ?? error)}`);
  }
}

/** The pid file of the instance's cluster names its port (fourth line): it must be the port the server uses. */
function checkClusterOfServer(): void {
  const port = new URL(process.env.DATABASE_URL ?? 'postgres://missing').port;
  const listening = readFileSync(path.join('.pgdata', instance(), 'postmaster.pid'), 'utf8').split('\n')[3]?.trim();
  if (!port || listening !== port) throw new Error(`cluster ${instance()} listens on ${listening}, DATABASE_URL on ${port}: set GATEWELL_TEST_INSTANCE`);
}

/** Stops or starts this run's PostgreSQL cluster under the running server (scripts/pg.sh). */
export function database(command: 'stop' | 'start' | 'restart', mode: 'fast' | 'immediate' = 'fast'): void {
  if (command !== 'start') checkClusterOfServer();
  runScript('pg.sh', command, mode);
}

/** Stops or starts this run's fake SMTP server (scripts/fake-smtp.sh). */
export function mailServer(command: 'stop' | 'start'): void {
  runScript('fake-smtp.sh', command);
}

/** Waits until the server's health check says the database answers again. */
export async function waitForHealthy(request: APIRequestContext): Promise<void> {
  await expect.poll(async () => (await request.get('/api/health')).status(), { timeout: 90_000, intervals: [250, 500, 1000] }).toBe(200);
}

/** The demo potassium export with extra blank lines (skipped on import), so that its SHA-256 is new. */
export function freshPotassiumExport(): Buffer {
  const text = readFileSync('seeders/data/demo-plates/kv-96-plate-01.csv', 'utf8');
  return Buffer.from(`${text.trimEnd()}${'\n'.repeat(1 + (Date.now() % 997))}`, 'utf8');
}

/** The demo potassium screen's id (read while the database answers). */
export async function potassiumScreenId(): Promise<string> {
  return (await queryOne<{ id: string }>(`select id from screens where name = 'Potassium counter-screen'`))!.id;
}

/** Imports a fresh potassium plate through the import API (inspect, then commit with the proposed mapping). */
export async function importThroughApi(request: APIRequestContext, baseURL: string, screenId: string, label: string): Promise<{ status: number; body: Record<string, unknown> }> {
  const file = { name: `${label.toLowerCase()}.csv`, mimeType: 'text/csv', buffer: freshPotassiumExport() };
  const headers = { origin: baseURL };
  const inspected = await request.post('/api/imports/inspect', { headers, multipart: { file, screenId: screenId } });
  if (inspected.status() !== 200) return { status: inspected.status(), body: await inspected.json() };
  const [sheet] = (await inspected.json()).sheets as { name: string; guess: { mapping: unknown } }[];
  const committed = await request.post('/api/imports/commit', {
    headers, multipart: { file, screenId: screenId, sheet: sheet!.name, mapping: JSON.stringify(sheet!.guess.mapping), format: '', label },
  });
  return { status: committed.status(), body: await committed.json() };
}
