import { readdirSync, readFileSync } from 'node:fs';
import { setPriority } from 'node:os';

// The background nice value of this process once runInBackground has set it, for its database sessions.
const NICENESS_KEY = Symbol.for('gatewell.background.niceness');
const store = globalThis as { [NICENESS_KEY]?: number };

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
    store[NICENESS_KEY] = niceness;
    return niceness;
  } catch {
    return null;
  }
}

/** The nice value runInBackground gave this process, or null when it runs at normal priority. */
export function backgroundNiceness(): number | null {
  return store[NICENESS_KEY] ?? null;
}

interface QueryClient {
  query(text: string): Promise<{ rows: { pid: number; host: string | null }[] }>;
}

/**
 * Gives the PostgreSQL backend serving this connection the same nice value, when the server runs on
 * this machine: a worker's imports and refits then yield the CPU to the sessions serving pages as its
 * own threads do. Applied only when the server answers on a loopback address or a Unix socket and the
 * backend's process id is a process named "postgres" here; a refusal (another user's process without
 * privilege) or any other failure leaves the priority as it was. Returns the value set, or null.
 */
export async function lowerBackendPriority(client: QueryClient, niceness: number): Promise<number | null> {
  try {
    const { rows } = await client.query('select pg_backend_pid() as pid, host(inet_server_addr()) as host');
    const backend = rows[0];
    if (!backend || (backend.host !== null && backend.host !== '127.0.0.1' && backend.host !== '::1')) return null;
    if (readFileSync(`/proc/${backend.pid}/comm`, 'utf8').trim() !== 'postgres') return null;
    setPriority(backend.pid, niceness);
    return niceness;
  } catch {
    return null;
  }
}
