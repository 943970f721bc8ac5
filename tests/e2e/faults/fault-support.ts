import { execFileSync } from 'node:child_process';
import { expect, type APIRequestContext } from '@playwright/test';
import { testCluster, testClusterInstance } from '../../support/test-cluster';
import { freshPotassiumExport, queryOne } from '../support';

/** Stops or starts this run's fake SMTP server (scripts/fake-smtp.sh) and fails with the script's own words if it fails. */
export function mailServer(command: 'stop' | 'start'): void {
  try {
    execFileSync('bash', ['scripts/fake-smtp.sh', command, testClusterInstance()], {
      stdio: ['ignore', 'ignore', 'pipe'],
      timeout: 60_000,
    });
  } catch (error) {
    throw new Error(
      `scripts/fake-smtp.sh ${command} ${testClusterInstance()} failed: ${String((error as { stderr?: Buffer }).stderr ?? error)}`,
    );
  }
}

/** Stops, starts or restarts this run's PostgreSQL cluster under the running server (scripts/pg.sh, checked against DATABASE_URL). */
export const database = testCluster;

/** Waits until the server's health check says the database answers again. */
export async function waitForHealthy(request: APIRequestContext): Promise<void> {
  await expect
    .poll(async () => (await request.get('/api/health')).status(), {
      timeout: 90_000,
      intervals: [250, 500, 1000],
    })
    .toBe(200);
}

/** The demo potassium screen's id (read while the database answers). */
export async function potassiumScreenId(): Promise<string> {
  return (await queryOne<{ id: string }>(`select id from screens where name = 'Potassium counter-screen'`))!
    .id;
}

/** Imports a fresh potassium plate through the import API (inspect, then commit with the proposed mapping). */
export async function importThroughApi(
  request: APIRequestContext,
  baseURL: string,
  screenId: string,
  label: string,
): Promise<{ status: number; body: Record<string, unknown> }> {
  const file = { name: `${label.toLowerCase()}.csv`, mimeType: 'text/csv', buffer: freshPotassiumExport() };
  const headers = { origin: baseURL };
  const inspected = await request.post('/api/imports/inspect', { headers, multipart: { file, screenId } });
  if (inspected.status() !== 200) return { status: inspected.status(), body: await inspected.json() };
  const [sheet] = (await inspected.json()).sheets as { name: string; guess: { mapping: unknown } }[];
  const committed = await request.post('/api/imports/commit', {
    headers,
    multipart: {
      file,
      screenId,
      sheet: sheet!.name,
      mapping: JSON.stringify(sheet!.guess.mapping),
      format: '',
      label,
    },
  });
  return { status: committed.status(), body: await committed.json() };
}
