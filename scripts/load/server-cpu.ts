// CPU time of the server under test, from Linux's /proc: utime + stime of the process and its threads, and
// of every live process below it (the web processes that scripts/serve.mjs starts with --processes N).
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';

function ticksPerSecond(): number {
  try {
    return Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
  } catch {
    return 100; // USER_HZ on Linux
  }
}

/** Fields of /proc/<pid>/stat after the command name (which may hold spaces); field 3 of the file is index 0. */
function statFields(pid: number): string[] | null {
  try {
    return readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  } catch {
    return null;
  }
}

/** The process and every live process below it. */
function processTree(root: number): number[] {
  const children = new Map<number, number[]>();
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    const parent = Number(statFields(Number(name))?.[1]);
    if (parent) children.set(parent, [...(children.get(parent) ?? []), Number(name)]);
  }
  const tree = [root];
  for (let i = 0; i < tree.length; i++) tree.push(...(children.get(tree[i]!) ?? []));
  return tree;
}

/** Seconds of CPU the process and the processes below it have used so far, or null when /proc has no such process. */
export function cpuSeconds(pid: number): number | null {
  if (!statFields(pid)) return null;
  let ticks = 0;
  for (const member of processTree(pid)) {
    const fields = statFields(member);
    // utime and stime are fields 14 and 15 of the file.
    if (fields) ticks += Number(fields[11]) + Number(fields[12]);
  }
  return ticks / ticksPerSecond();
}

/** Busy and total CPU ticks of the whole machine so far (/proc/stat), or null off Linux. */
function machineTicks(): { busy: number; total: number } | null {
  try {
    const [, ...fields] = readFileSync('/proc/stat', 'utf8').split('\n')[0]!.trim().split(/\s+/);
    const ticks = fields.map(Number);
    const idle = (ticks[3] ?? 0) + (ticks[4] ?? 0); // idle and iowait
    const total = ticks.slice(0, 8).reduce((sum, t) => sum + t, 0); // user … steal; guest time is inside user
    return { busy: total - idle, total };
  } catch {
    return null;
  }
}

/** CPU ticks of every live process so far, by pid, with a short name for it (its command line). */
function allProcesses(): Map<number, { ticks: number; name: string }> {
  const all = new Map<number, { ticks: number; name: string }>();
  let names: string[] = [];
  try {
    names = readdirSync('/proc').filter((name) => /^\d+$/.test(name));
  } catch {
    return all;
  }
  for (const name of names) {
    const fields = statFields(Number(name));
    if (!fields) continue;
    let command = '';
    try {
      command = readFileSync(`/proc/${name}/cmdline`, 'utf8').split('\0').filter(Boolean).join(' ');
    } catch {
      // The process ended meanwhile.
    }
    all.set(Number(name), { ticks: Number(fields[11]) + Number(fields[12]), name: command || `[${name}]` });
  }
  return all;
}

/** A process group's name: PostgreSQL's backends as one, node processes by script, others by program. */
function groupName(command: string): string {
  if (command.startsWith('postgres')) return 'PostgreSQL';
  const words = command.split(' ');
  const script = words.find((word) => /\.(m?[jt]s|cjs)$/.test(word) || word.endsWith('/next'));
  return script
    ? `${words[0]!.split('/').pop()} ${script.split('/').slice(-2).join('/')}`
    : words.slice(0, 2).join(' ').slice(0, 60);
}

export interface CpuReading {
  server: number | null;
  worker: number | null;
  database: number | null;
  machine: { busy: number; total: number } | null;
  processes: Map<number, { ticks: number; name: string }>;
}

/** Seconds of CPU the web server and a job worker used, and the machine's busy share, between two readings. */
export interface CpuUse {
  server: number | null;
  worker: number | null;
  /** PostgreSQL: its postmaster and the backends below it (this cluster only, not other clusters on the machine). */
  database: number | null;
  machine: number | null;
  /** Seconds of CPU by process group, busiest first. */
  busiest: [string, number][];
}

export function cpuNow(pids: {
  serverPid?: number | undefined;
  workerPid?: number | undefined;
  dbPid?: number | undefined;
}): CpuReading {
  return {
    server: pids.serverPid ? cpuSeconds(pids.serverPid) : null,
    worker: pids.workerPid ? cpuSeconds(pids.workerPid) : null,
    database: pids.dbPid ? cpuSeconds(pids.dbPid) : null,
    machine: machineTicks(),
    processes: allProcesses(),
  };
}

export function cpuSince(before: CpuReading, after: CpuReading): CpuUse {
  const difference = (a: number | null, b: number | null) => (a !== null && b !== null ? b - a : null);
  const machine =
    before.machine && after.machine && after.machine.total > before.machine.total
      ? (after.machine.busy - before.machine.busy) / (after.machine.total - before.machine.total)
      : null;
  const groups = new Map<string, number>();
  for (const [pid, { ticks, name }] of after.processes) {
    const used = ticks - (before.processes.get(pid)?.ticks ?? 0);
    if (used > 0) groups.set(groupName(name), (groups.get(groupName(name)) ?? 0) + used / ticksPerSecond());
  }
  const busiest = [...groups].sort((a, b) => b[1] - a[1]).slice(0, 6);
  return {
    server: difference(before.server, after.server),
    worker: difference(before.worker, after.worker),
    database: difference(before.database, after.database),
    machine,
    busiest,
  };
}
