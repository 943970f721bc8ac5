// A job worker at a background priority puts the PostgreSQL sessions it opens there too (nice value and,
// when asked, the SCHED_IDLE class), so that imports and refits on the web server's machine yield the
// database's CPU to page requests as well. Read back from /proc (Linux), with the test cluster on this
// machine as the product runs it.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { lowerBackendPriority, schedulingPolicy } from '@/lib/jobs/background-priority';

const niceOf = (pid: number) =>
  Number(readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')[16]);

describe.runIf(process.platform === 'linux')('database sessions of background work', () => {
  afterAll(() => db().close());

  /** Runs a process put in the background as asked, and reads back nice value and policy of its database session. */
  function backendOfBackgroundProcess(
    niceness: number,
    idle: boolean,
  ): { pid: number; nice: number; policy: string; idle: boolean } {
    const script = `
      import { readFileSync } from 'node:fs';
      const loaded = await import('./lib/jobs/background-priority.ts');
      const priority = loaded.default ?? loaded;
      const set = priority.runInBackground(${niceness}, { idle: ${idle} });
      const database = await import('./lib/db.ts');
      const sequelize = (database.default ?? database).db();
      const [row] = await sequelize.query('select pg_backend_pid() as pid', { type: 'SELECT' });
      const nice = Number(readFileSync('/proc/' + row.pid + '/stat', 'utf8').split(') ')[1].split(' ')[16]);
      console.log(JSON.stringify({ pid: row.pid, nice, policy: priority.schedulingPolicy(row.pid), idle: set.idle }));
      await sequelize.close();
    `;
    const output = execFileSync(
      process.execPath,
      ['--conditions=react-server', '--import', 'tsx', '--input-type=module', '-e', script],
      {
        cwd: path.resolve(__dirname, '../..'),
        encoding: 'utf8',
        env: process.env,
      },
    );
    return JSON.parse(output.trim().split('\n').at(-1)!);
  }

  test('a process put in the background by runInBackground opens its database sessions at the same nice value', () => {
    expect(backendOfBackgroundProcess(9, false)).toMatchObject({ nice: 9, policy: 'normal', idle: false });
  });

  // The worker's default: its sessions go into SCHED_IDLE with it (where chrt may set another user's
  // process: as root, as the suite runs here and in CI).
  test.runIf(process.getuid?.() === 0)(
    'a process in SCHED_IDLE opens its database sessions in SCHED_IDLE too',
    () => {
      expect(backendOfBackgroundProcess(19, true)).toMatchObject({ nice: 19, policy: 'idle', idle: true });
    },
  );

  test('the sessions of a process at normal priority stay at nice 0 in the normal class', async () => {
    const [row] = await db().query<{ pid: number }>('select pg_backend_pid() as pid', {
      type: QueryTypes.SELECT,
    });
    expect(niceOf(row!.pid)).toBe(0);
    expect(schedulingPolicy(row!.pid)).toBe('normal');
  });

  test('lowerBackendPriority leaves a server that is not on this machine alone', async () => {
    const calls: string[] = [];
    const remote = {
      query: async (text: string) => {
        calls.push(text);
        return { rows: [{ pid: process.pid, host: '10.1.2.3' }] };
      },
    };
    expect(await lowerBackendPriority(remote, { niceness: 5, idle: true })).toBeNull();
    expect(calls).toHaveLength(1);
    // Our own pid answered as a "backend" on loopback is not a postgres process: refused too.
    const impostor = { query: async () => ({ rows: [{ pid: process.pid, host: '127.0.0.1' }] }) };
    expect(await lowerBackendPriority(impostor, { niceness: 5, idle: true })).toBeNull();
    expect(niceOf(process.pid)).toBe(0);
    expect(schedulingPolicy(process.pid)).toBe('normal');
  });
});
