import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { makeActor } from '../support/actors';
import { ownerUrl, resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

const run = promisify(execFile);
const TARGET = `gatewell_restore_${process.pid}`;
const testUrl = new URL(process.env.DATABASE_URL!);
const targetUrl = Object.assign(new URL(testUrl.href), { pathname: `/${TARGET}` }).href;
const targetOwnerUrl = Object.assign(new URL(ownerUrl()), { pathname: `/${TARGET}` }).href;

/** Runs scripts/backup.sh or restore.sh: by the URLs (the owner's first), or by the test cluster's port as the postgres user. */
async function script(name: 'backup.sh' | 'restore.sh', args: string[], how: 'url' | 'cluster') {
  const env: NodeJS.ProcessEnv = { ...process.env, GATEWELL_PG_TEST_PORT: testUrl.port };
  if (how === 'cluster') {
    delete env.DATABASE_URL;
    delete env.DATABASE_OWNER_URL;
  }
  return run('bash', [`scripts/${name}`, ...args], { env, timeout: 60_000 });
}

async function withClient<T>(url: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** Row count of every table, and the whole audit trail in order. */
async function snapshot(url: string) {
  return withClient(url, async (client) => {
    const tables = (
      await client.query<{ tablename: string }>(
        `select tablename from pg_tables where schemaname = 'public' order by tablename`,
      )
    ).rows;
    const counts: Record<string, number> = {};
    for (const { tablename } of tables)
      counts[tablename] = Number((await client.query(`select count(*) as n from "${tablename}"`)).rows[0].n);
    const audit = (await client.query('select * from audit_events order by id')).rows;
    return { counts, audit };
  });
}

describe('a backup restores into a fresh database with every row and the audit guard', () => {
  const folder = mkdtempSync(path.join(tmpdir(), 'gatewell-backup-'));
  const dump = path.join(folder, 'gatewell.dump');

  beforeAll(async () => {
    await resetDatabase();
    const screens = await makeDemoScreens(await makeActor(['admin']), await makeActor(['chemist']));
    const biologist = await makeActor(['biologist']);
    await importDemoPlate(biologist, screens, 'nav-96-plate-01.xlsx');
  });
  afterAll(async () => {
    await withClient(Object.assign(new URL(ownerUrl()), { pathname: '/postgres' }).href, (client) =>
      client.query(`drop database if exists ${TARGET} with (force)`),
    );
    rmSync(folder, { recursive: true, force: true });
    await db().close();
  });

  test('dump, restore, and compare row counts and the audit trail; UPDATE on the audit trail is still refused', async () => {
    const { stdout } = await script('backup.sh', ['--out', dump], 'url');
    expect(stdout.trim()).toBe(dump);
    expect(readFileSync(dump).subarray(0, 5).toString('latin1')).toBe('PGDMP');

    await script('restore.sh', [dump, TARGET, 'test'], 'cluster');
    const [original, restored] = [await snapshot(testUrl.href), await snapshot(targetUrl)];
    expect(original.counts.plates).toBe(1);
    expect(original.counts.wells).toBeGreaterThan(0);
    expect(original.audit.length).toBeGreaterThan(0);
    expect(restored.counts).toEqual(original.counts);
    expect(restored.audit).toEqual(original.audit);

    // The restored database keeps both guards: the app's role is not granted changes, and the owner meets the trigger.
    await withClient(targetUrl, async (client) => {
      await expect(client.query(`update audit_events set reason = 'rewritten'`)).rejects.toThrow(
        'permission denied for table audit_events',
      );
      await expect(
        client.query('alter table audit_events disable trigger audit_events_no_update'),
      ).rejects.toThrow('must be owner of table audit_events');
    });
    await withClient(targetOwnerUrl, async (client) => {
      await expect(client.query(`update audit_events set reason = 'rewritten'`)).rejects.toThrow(
        'audit_events is append-only: UPDATE refused',
      );
      await expect(client.query('delete from audit_events')).rejects.toThrow(
        'audit_events is append-only: DELETE refused',
      );
    });
  });

  test('a database that already holds tables is refused unless --replace, and is left as it was', async () => {
    const before = await snapshot(targetUrl);
    await expect(script('restore.sh', [dump, TARGET, 'test'], 'cluster')).rejects.toMatchObject({
      stderr: expect.stringContaining(`database ${TARGET} is not empty`),
    });
    expect(await snapshot(targetUrl)).toEqual(before);
    await script('restore.sh', [dump, TARGET, 'test', '--replace'], 'cluster');
    expect((await snapshot(targetUrl)).counts).toEqual(before.counts);
  });
});
