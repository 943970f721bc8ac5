import { execFile } from 'node:child_process';
import { rmSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

// scripts/pg.sh hands a database made before the two roles (it and every table owned by the app's role,
// the layout of Gatewell's clusters until migration 20261205000100) to the schema's owner, and the next
// migrate grants the app its rows: nothing lost, and the app may no longer alter a table or change the
// audit trail. A cluster of its own (instance test-roles), so the run's test database is left alone.
const run = promisify(execFile);
const INSTANCE = 'test-roles';
const PORT = process.env.GATEWELL_PG_ROLES_TEST_PORT ?? '54361';
const env: NodeJS.ProcessEnv = { ...process.env, GATEWELL_PG_TEST_PORT: PORT };
delete env.DATABASE_OWNER_URL;

async function pgScript(...args: string[]): Promise<string> {
  return (await run('bash', ['scripts/pg.sh', ...args, INSTANCE], { env, timeout: 120_000 })).stdout.trim();
}

async function migrate(urls: { app: string; owner?: string }): Promise<void> {
  await run('npx', ['sequelize-cli', 'db:migrate'], {
    env: { ...env, DATABASE_URL: urls.app, ...(urls.owner ? { DATABASE_OWNER_URL: urls.owner } : {}) },
    timeout: 120_000,
  });
}

/** One SQL script as the cluster's superuser, over its socket (as scripts/pg-connect.sh does). */
async function asSuperuser(sql: string): Promise<void> {
  const psql = [
    '/usr/lib/postgresql/15/bin/psql',
    '-h',
    path.join(process.cwd(), '.pgrun'),
    '-p',
    PORT,
    '-U',
    'postgres',
    '-v',
    'ON_ERROR_STOP=1',
    '-qAt',
    '-c',
    sql,
  ];
  const [command, ...args] = process.getuid?.() === 0 ? ['runuser', '-u', 'postgres', '--', ...psql] : psql;
  await run(command!, args, { timeout: 30_000 });
}

async function query<Row extends pg.QueryResultRow>(url: string, sql: string): Promise<Row[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return (await client.query<Row>(sql)).rows;
  } finally {
    await client.end();
  }
}

describe('a database from before the two roles', () => {
  let appUrl: string;
  let ownerUrl: string;

  beforeAll(async () => {
    await pgScript('start');
    [appUrl, ownerUrl] = [await pgScript('url'), await pgScript('owner-url')];
    // The earlier layout: the database owned by the app's role, migrated by it alone, with a row of audit.
    await asSuperuser('drop database if exists gatewell_test with (force)');
    await asSuperuser('create database gatewell_test owner gatewell');
    await migrate({ app: appUrl });
    await query(
      appUrl,
      `insert into audit_events (actor_id, action, entity_type, entity_id, reason) values (null, 'create', 'screen', 's-1', 'before the roles')`,
    );
    expect(
      await query(
        appUrl,
        `select distinct pg_get_userbyid(relowner) as owner from pg_class where relnamespace = 'public'::regnamespace`,
      ),
    ).toEqual([{ owner: 'gatewell' }]);
  }, 240_000);
  afterAll(async () => {
    await pgScript('stop').catch(() => undefined);
    rmSync(path.join(process.cwd(), '.pgdata', INSTANCE), { recursive: true, force: true });
  });

  test('is handed to the owner by scripts/pg.sh start; after migrate the app keeps its rows and loses the power to change the audit trail', async () => {
    await pgScript('start');
    await migrate({ app: appUrl, owner: ownerUrl });

    expect(
      await query(
        appUrl,
        `select distinct pg_get_userbyid(relowner) as owner from pg_class where relnamespace = 'public'::regnamespace`,
      ),
    ).toEqual([{ owner: 'gatewell_owner' }]);
    expect(
      await query(
        appUrl,
        `select pg_get_userbyid(datdba) as owner from pg_database where datname = current_database()`,
      ),
    ).toEqual([{ owner: 'gatewell_owner' }]);
    expect(await query(appUrl, `select reason from audit_events`)).toEqual([{ reason: 'before the roles' }]);
    expect(
      await query(
        appUrl,
        `select has_table_privilege('audit_events', 'update') as update, has_table_privilege('audit_events', 'insert') as insert, has_table_privilege('plates', 'update') as plates`,
      ),
    ).toEqual([{ update: false, insert: true, plates: true }]);
    await expect(query(appUrl, `update audit_events set reason = 'rewritten'`)).rejects.toThrow(
      'permission denied for table audit_events',
    );
    await expect(
      query(appUrl, 'alter table audit_events disable trigger audit_events_no_update'),
    ).rejects.toThrow('must be owner of table audit_events');
    await expect(query(ownerUrl, `update audit_events set reason = 'rewritten'`)).rejects.toThrow(
      'audit_events is append-only: UPDATE refused',
    );
  }, 240_000);
});
