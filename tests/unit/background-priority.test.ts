import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';

// Background work yields the CPU to page requests through nice values (setpriority(2): on Linux a
// nice value belongs to each thread). These read the values back from /proc, so they run on Linux only.
const linux = process.platform === 'linux';

/** Nice value of each thread of this process (field 19 of /proc/self/task/<tid>/stat). */
function threadNiceness(): number[] {
  return readdirSync('/proc/self/task').flatMap((tid) => {
    try {
      return [Number(readFileSync(`/proc/self/task/${tid}/stat`, 'utf8').split(') ')[1]!.split(' ')[16])];
    } catch {
      return [];
    }
  });
}

describe.runIf(linux)('background priority', () => {
  test('runInBackground sets every thread of the process, and threads started later inherit it', () => {
    const script = `
      import { readdirSync, readFileSync } from 'node:fs';
      import { Worker } from 'node:worker_threads';
      const loaded = await import('./lib/jobs/background-priority.ts');
      const { runInBackground } = loaded.default ?? loaded;
      const nices = () => readdirSync('/proc/self/task').map((tid) => Number(readFileSync('/proc/self/task/' + tid + '/stat', 'utf8').split(') ')[1].split(' ')[16]));
      const set = runInBackground(7);
      const worker = new Worker('setTimeout(() => {}, 300)', { eval: true });
      worker.on('online', () => { console.log(JSON.stringify({ set, nices: nices() })); worker.terminate(); });
    `;
    const output = execFileSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], {
      cwd: path.resolve(__dirname, '../..'),
      encoding: 'utf8',
    });
    const { set, nices } = JSON.parse(output) as {
      set: { niceness: number; idle: boolean };
      nices: number[];
    };
    expect(set).toEqual({ niceness: 7, idle: false });
    expect(nices.length).toBeGreaterThan(2);
    expect(new Set(nices)).toEqual(new Set([7]));
  });

  test('with idle, every thread goes into SCHED_IDLE, and threads started later inherit it', () => {
    const script = `
      import { readdirSync } from 'node:fs';
      import { Worker } from 'node:worker_threads';
      const loaded = await import('./lib/jobs/background-priority.ts');
      const { runInBackground, schedulingPolicy } = loaded.default ?? loaded;
      const policies = () => readdirSync('/proc/self/task').map((tid) => schedulingPolicy(process.pid, Number(tid)));
      const before = policies();
      const set = runInBackground(19, { idle: true });
      const worker = new Worker('setTimeout(() => {}, 300)', { eval: true });
      worker.on('online', () => { console.log(JSON.stringify({ set, before, after: policies() })); worker.terminate(); });
    `;
    const output = execFileSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], {
      cwd: path.resolve(__dirname, '../..'),
      encoding: 'utf8',
    });
    const { set, before, after } = JSON.parse(output) as {
      set: { niceness: number; idle: boolean };
      before: string[];
      after: string[];
    };
    expect(set).toEqual({ niceness: 19, idle: true });
    expect(new Set(before)).toEqual(new Set(['normal']));
    expect(after.length).toBeGreaterThan(before.length); // the worker thread and its helpers
    expect(new Set(after)).toEqual(new Set(['idle']));
  });

  test('a file is read in a thread at nice 10 while the thread that asked stays as it was', async () => {
    const bytes = readFileSync(
      path.resolve(__dirname, '../../seeders/data/demo-plates/nav-384-plate-02.xlsx'),
    );
    const seen = new Set<number>();
    const watch = setInterval(() => threadNiceness().forEach((n) => seen.add(n)), 1);
    const result = await parseSpreadsheet(bytes, 'nav-384-plate-02.xlsx');
    clearInterval(watch);
    expect(result.ok).toBe(true);
    expect(seen.has(10)).toBe(true);
    expect(Number(readFileSync('/proc/thread-self/stat', 'utf8').split(') ')[1]!.split(' ')[16])).toBe(0);
  });

  test('an out-of-range nice value for the parse thread is refused', async () => {
    await expect(parseSpreadsheet(new Uint8Array([1, 2, 3]), 'a.csv', { niceness: 20 })).rejects.toThrow(
      RangeError,
    );
  });
});
