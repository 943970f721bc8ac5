import { execFile, execFileSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { setPriority } from 'node:os';
import { promisify } from 'node:util';

/** Where runInBackground put this process: its nice value, and whether it is in Linux's SCHED_IDLE class. */
export interface BackgroundPriority {
  niceness: number;
  idle: boolean;
}

// Where runInBackground has put this process, for its database sessions.
const PRIORITY_KEY = Symbol.for('gatewell.background.priority');
const store = globalThis as { [PRIORITY_KEY]?: BackgroundPriority };

const execFileAsync = promisify(execFile);
/** chrt(1) arguments that put a process (every thread with allThreads) in SCHED_IDLE. */
const idleArguments = (pid: number, allThreads: boolean) => [
  '--idle',
  ...(allThreads ? ['--all-tasks'] : []),
  '--pid',
  '0',
  String(pid),
];

/** Scheduling policy of a thread as /proc/<pid>/task/<tid>/stat gives it (field 41; sched_setscheduler(2) numbers). */
export function schedulingPolicy(
  pid: number,
  tid: number = pid,
): 'normal' | 'fifo' | 'round-robin' | 'batch' | 'idle' | 'deadline' {
  const fields = readFileSync(`/proc/${pid}/task/${tid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  const policies = ['normal', 'fifo', 'round-robin', 'batch', null, 'idle', 'deadline'] as const;
  const policy = policies[Number(fields[38])];
  if (!policy) throw new Error(`unknown scheduling policy ${fields[38]} for thread ${tid}`);
  return policy;
}

/**
 * Lowers this process to a background nice value, every thread it has now and (by inheritance) every
 * thread it starts later, so that a job worker on the web server's machine yields the CPU to page
 * requests. Linux keeps a nice value per thread (setpriority(2), NOTES), so each thread of
 * /proc/self/task is set; elsewhere only the calling thread is.
 *
 * With idle, every thread also goes into Linux's SCHED_IDLE class (sched(7)) through chrt(1) from
 * util-linux: a waking page request then takes a core from the worker at once, and the kernel counts
 * a core running only such threads as free when it places a waking thread, which a nice value alone
 * does not give. Where chrt is missing or refuses, the nice value still holds and idle is false.
 *
 * Returns where the process now is, or null when the system refused the nice value (a process may
 * raise its own nice value, never lower it without privilege).
 */
export function runInBackground(
  niceness: number,
  options: { idle?: boolean } = {},
): BackgroundPriority | null {
  if (!Number.isInteger(niceness) || niceness < 0 || niceness > 19)
    throw new RangeError('niceness must be a whole number from 0 to 19');
  try {
    setPriority(niceness);
    let threads: string[] = [];
    try {
      threads = readdirSync('/proc/self/task');
    } catch {
      // No /proc: the calling thread is set, and threads started from it inherit the value.
    }
    for (const thread of threads) setPriority(Number(thread), niceness);
  } catch {
    return null;
  }
  let idle = false;
  if (options.idle && process.platform === 'linux') {
    try {
      execFileSync('chrt', idleArguments(process.pid, true), { stdio: 'ignore', timeout: 5_000 });
      idle = true;
    } catch {
      // No chrt, or the system refused: the nice value alone stands.
    }
  }
  store[PRIORITY_KEY] = { niceness, idle };
  return store[PRIORITY_KEY];
}

/** Where runInBackground put this process, or null when it runs at normal priority. */
export function backgroundPriority(): BackgroundPriority | null {
  return store[PRIORITY_KEY] ?? null;
}

interface QueryClient {
  query(text: string): Promise<{ rows: { pid: number; host: string | null }[] }>;
}

/**
 * Gives the PostgreSQL backend serving this connection the same nice value (and SCHED_IDLE class when
 * the process has it), when the server runs on this machine: a worker's imports and refits then yield
 * the CPU to the sessions serving pages as its own threads do. Applied only when the server answers on
 * a loopback address or a Unix socket and the backend's process id is a process named "postgres" here;
 * a refusal (another user's process without privilege) or any other failure leaves the priority as it
 * was. Returns what was set, or null.
 */
export async function lowerBackendPriority(
  client: QueryClient,
  priority: BackgroundPriority,
): Promise<BackgroundPriority | null> {
  try {
    const { rows } = await client.query('select pg_backend_pid() as pid, host(inet_server_addr()) as host');
    const backend = rows[0];
    if (!backend || (backend.host !== null && backend.host !== '127.0.0.1' && backend.host !== '::1'))
      return null;
    if (readFileSync(`/proc/${backend.pid}/comm`, 'utf8').trim() !== 'postgres') return null;
    setPriority(backend.pid, priority.niceness);
    let idle = false;
    if (priority.idle) {
      idle = await execFileAsync('chrt', idleArguments(backend.pid, false), { timeout: 5_000 }).then(
        () => true,
        () => false,
      );
    }
    return { niceness: priority.niceness, idle };
  } catch {
    return null;
  }
}
