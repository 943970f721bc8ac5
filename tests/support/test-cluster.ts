import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { ownerUrl } from './schema-owner';

/** The test run's instance (scripts/pg.sh and scripts/fake-smtp.sh test or test-NAME, as scripts/test.sh names it). */
export function testClusterInstance(): string {
  return process.env.GATEWELL_TEST_INSTANCE ?? 'test';
}

/**
 * Refuses to touch a cluster other than the one DATABASE_URL points at: the instance's running
 * postmaster (its pid file, fourth line) must listen on DATABASE_URL's port.
 */
function checkClusterIsTheTestDatabase(instance: string): void {
  const port = new URL(process.env.DATABASE_URL ?? 'postgres://missing').port;
  const pidFile = path.join(process.cwd(), '.pgdata', instance, 'postmaster.pid');
  let listening: string | undefined;
  try {
    listening = readFileSync(pidFile, 'utf8').split('\n')[3]?.trim();
  } catch {
    listening = undefined;
  }
  if (!port || listening !== port) {
    throw new Error(
      `cluster ${instance} (${pidFile}) listens on ${listening ?? 'nothing'}, DATABASE_URL on ${port || 'no port'}: set GATEWELL_TEST_INSTANCE to the cluster of DATABASE_URL`,
    );
  }
}

/**
 * Runs scripts/pg.sh on the test cluster, e.g. restart in immediate mode, and resolves when it has finished.
 * Asynchronous on purpose: the pool sees its connections end while the command runs, as a server would.
 */
export async function testCluster(
  command: 'restart' | 'stop' | 'start',
  mode: 'fast' | 'immediate' = 'fast',
): Promise<void> {
  const instance = testClusterInstance();
  if (command !== 'start') checkClusterIsTheTestDatabase(instance);
  await promisify(execFile)('bash', ['scripts/pg.sh', command, instance, mode], { timeout: 120_000 });
}

/**
 * A connection of its own to the test database, outside Gatewell's pool, as the app's role or as the
 * schema's owner (for a lock the app may not take); errors after a restart are expected and ignored.
 */
export async function outsideClient(as: 'app' | 'owner' = 'app'): Promise<pg.Client> {
  const client = new pg.Client({ connectionString: as === 'owner' ? ownerUrl() : process.env.DATABASE_URL });
  client.on('error', () => undefined);
  await client.connect();
  return client;
}

/** Polls until `probe` yields a value, or throws `message` after `timeoutMs`. */
export async function pollFor<T>(
  probe: () => Promise<T | undefined>,
  message: string,
  timeoutMs = 30_000,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await probe();
    if (found !== undefined) return found;
    if (Date.now() > deadline) throw new Error(`${message} (waited ${timeoutMs} ms)`);
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
}
