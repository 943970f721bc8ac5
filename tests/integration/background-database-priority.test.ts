// A job worker at a background nice value puts the PostgreSQL sessions it opens at that value too, so
// that imports and refits on the web server's machine yield the database's CPU to page requests as
// well. Read back from /proc (Linux), with the test cluster on this machine as the product runs it.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { lowerBackendPriority } from '@/lib/jobs/background-priority';

const niceOf = (pid: number) => Number(readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')[16]);

describe.runIf(process.platform === 'linux')('database sessions of background work', () => {
  afterAll(() => db().close());

  test('a process put in the background by runInBackground opens its database sessions at the same nice value', () => {
    const script = `
      import { readFileSync } from 'node:fs';
      const priority = await import('./lib/jobs/background-priority.ts');
      (priority.default ?? priority).runInBackground(9);
      const database = await import('./lib/db.ts');
      const sequelize = (database.default ?? database).db();
      const [row] = await sequelize.query('select pg_backend_pid() as pid', { type: 'SELECT' });
      const nice = Number(readFileSync('/proc/' + row.pid + '/stat', 'utf8').split(') ')[1].split(' ')[16]);
      console.log(JSON.stringify({ pid: row.pid, nice }));
      await sequelize.close();
    `;
    const output = execFileSync(process.execPath, ['--conditions=react-server', '--import', 'tsx', '--input-type=module', '-e', script], {
      cwd: path.resolve(__dirname, '../..'), encoding: 'utf8', env: process.env,
    });
    expect(JSON.parse(output.trim().split('\n').at(-1)!)).toMatchObject({ nice: 9 });
  });

  test('the sessions of a process at normal priority stay at nice 0', async () => {
    const [row] = await db().query<{ pid: number }>('select pg_backend_pid() as pid', { type: QueryTypes.SELECT });
    expect(niceOf(row!.pid)).toBe(0);
  });

  test('lowerBackendPriority leaves a server that is not on this machine alone', async () => {
    const calls: string[] = [];
    const remote = { query: async (text: string) => { calls.push(text); return { rows: [{ pid: process.pid, host: '10.1.2.3' }] }; } };
    expect(await lowerBackendPriority(remote, 5)).toBeNull();
    expect(calls).toHaveLength(1);
    // Our own pid answered as a "backend" on loopback is not a postgres process: refused too.
    const impostor = { query: async () => ({ rows: [{ pid: process.pid, host: '127.0.0.1' }] }) };
    expect(await lowerBackendPriority(impostor, 5)).toBeNull();
    expect(niceOf(process.pid)).toBe(0);
  });
});
