// CPU time of the server process under test, from Linux's /proc (utime + stime of the process and its threads).
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';

function ticksPerSecond(): number {
  try {
    return Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
  } catch {
    return 100; // USER_HZ on Linux
  }
}

/** Seconds of CPU the process has used so far, or null when /proc has no such process. */
export function cpuSeconds(pid: number): number | null {
  try {
    // Fields after the command name (which may hold spaces) start at field 3; utime and stime are fields 14 and 15.
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    return (Number(fields[11]) + Number(fields[12])) / ticksPerSecond();
  } catch {
    return null;
  }
}
