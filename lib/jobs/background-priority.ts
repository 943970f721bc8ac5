import { readdirSync } from 'node:fs';
import { setPriority } from 'node:os';

/**
 * Lowers this process to a background nice value, every thread it has now and (by inheritance) every
 * thread it starts later, so that a job worker on the web server's machine yields the CPU to page
 * requests. Linux keeps a nice value per thread (setpriority(2), NOTES), so each thread of
 * /proc/self/task is set; elsewhere only the calling thread is. Returns the value set, or null when the
 * system refused (a process may raise its own nice value, never lower it without privilege).
 */
export function runInBackground(niceness: number): number | null {
  if (!Number.isInteger(niceness) || niceness < 0 || niceness > 19) throw new RangeError('niceness must be a whole number from 0 to 19');
  try {
    setPriority(niceness);
    let threads: string[] = [];
    try {
      threads = readdirSync('/proc/self/task');
    } catch {
      // No /proc: the calling thread is set, and threads started from it inherit the value.
    }
    for (const thread of threads) setPriority(Number(thread), niceness);
    return niceness;
  } catch {
    return null;
  }
}
