// Command-line options of scripts/load-test.ts, checked with zod.
import { parseArgs } from 'node:util';
import { z } from 'zod';

const count = (max: number) => z.coerce.number().int().min(0).max(max);

const schema = z.object({
  url: z.url({ protocol: /^https?$/ }).default('http://127.0.0.1:4340'),
  readers: count(1000).default(50),
  importers: count(100).default(5),
  durationS: z.coerce.number().int().min(1).max(3600).default(30),
  warmUpS: z.coerce.number().int().min(0).max(600).default(10),
  readRate: count(10_000).optional(),
  importRate: count(1000).default(0),
  plates: z.coerce.number().int().min(1).max(100).default(4),
  p95LimitMs: z.coerce.number().positive().default(100),
  timeoutS: z.coerce.number().positive().max(600).default(10),
  importTimeoutS: z.coerce.number().positive().max(600).default(60),
  grow: count(100_000).default(0),
  prepare: count(100_000).optional(),
  seed: z.coerce
    .number()
    .int()
    .min(0)
    .max(2 ** 31)
    .optional(),
  serverPid: z.coerce.number().int().positive().optional(),
  workerPid: z.coerce.number().int().positive().optional(),
  dbPid: z.coerce.number().int().positive().optional(),
  documents: z.boolean().default(false),
  probes: z.string().optional(),
  readerAccounts: z
    .string()
    .regex(/^[a-z0-9]+(,[a-z0-9]+)*$/, 'a comma-separated list of demo account names such as admin,approver')
    .optional(),
  reportOnly: z.boolean().default(false),
});

/** The flag of each option whose name differs from its key. */
const FLAGS: Record<string, string> = {
  durationS: 'duration',
  warmUpS: 'warm-up',
  readRate: 'read-rate',
  importRate: 'import-rate',
  p95LimitMs: 'p95-limit',
  timeoutS: 'timeout',
  importTimeoutS: 'import-timeout',
  reportOnly: 'report-only',
  serverPid: 'server-pid',
  workerPid: 'worker-pid',
  dbPid: 'db-pid',
  readerAccounts: 'reader-accounts',
};

export type LoadOptions = z.infer<typeof schema> & { readRate: number; prepare: number; seed: number };

export const USAGE = `usage: node --import tsx scripts/load-test.ts [options]
  --url URL            the running production build (default http://127.0.0.1:4340)
  --readers N          signed-in people reading plates (default 50), each with a session of a demo user in turn
  --read-rate N        reads per second from all readers together, spread evenly over the readers and over each
                       second (default: as many as readers, one per reader per second); 0 lets every reader
                       send the next read as soon as the answer arrives
  --importers N        biologist sessions posting plate exports to /api/imports/commit (default 5)
  --import-rate N      imports per second from all importers together, taking turns; 0 (default) lets every
                       importer post the next export as soon as the answer arrives
  --duration S         seconds of load (default 30)
  --warm-up S          seconds of the same load before the clock starts, not measured (default 10), so that every
                       web process has compiled its hot code
  --plates N           how many plates of the plate list the readers open (default 4)
  --documents          every page of the walk as a full document load (as if the browser reloaded at each step)
                       instead of the client-side navigations a browser makes after the first page
  --p95-limit MS       reads must answer within this at the 95th percentile (default 100)
  --timeout S          seconds before a read counts as timed out (default 10)
  --import-timeout S   seconds before an import counts as timed out (default 60: the server withdraws an import no job
                       worker took within 60 s and answers 503)
  --grow N             import N more exports before the clock starts (not measured), so that reads meet a longer
                       plate list (default 0)
  --prepare N          commit requests encoded before the run (default 1 + grow + the imports of warm-up and duration at
                       the import rate, or at 2 a second per importer when back to back); more are built on demand
  --seed N             first seed of the generated exports (default from the clock)
  --server-pid PID     the server's process id: prints the CPU time it and the processes below it used during the load (Linux)
  --worker-pid PID     a job worker's process id: prints its CPU time too
  --db-pid PID         PostgreSQL's postmaster process id: prints the CPU time of it and its backends (this
                       cluster only) and per answer
  --probes FILE        also read compound profiles, the audit trail and later plate-list pages, with the ids the
                       scale fill wrote to FILE (scripts/scale-test.sh)
  --reader-accounts L  readers sign in only as these demo accounts, e.g. admin,approver,approver2 (who may read
                       the audit trail); default every demo account in turn
  --report-only        print the figures and exit 0 even when a target is missed`;

/** About how many imports warm-up and measured load post: at the import rate, or at 2 a second per importer back to back. */
function expectedImports(options: {
  importers: number;
  importRate: number;
  durationS: number;
  warmUpS: number;
}): number {
  if (options.importers === 0) return 0;
  const perSecond = options.importRate > 0 ? options.importRate : 2 * options.importers;
  return Math.ceil(perSecond * (options.durationS + options.warmUpS));
}

/** The options of this run, or a message saying what is wrong with the command line. */
export function parseOptions(
  argv: string[],
): { ok: true; options: LoadOptions } | { ok: false; message: string; exitCode: number } {
  let values;
  try {
    ({ values } = parseArgs({
      args: argv,
      options: {
        url: { type: 'string' },
        readers: { type: 'string' },
        importers: { type: 'string' },
        duration: { type: 'string' },
        'warm-up': { type: 'string' },
        'read-rate': { type: 'string' },
        'import-rate': { type: 'string' },
        plates: { type: 'string' },
        'p95-limit': { type: 'string' },
        timeout: { type: 'string' },
        'import-timeout': { type: 'string' },
        grow: { type: 'string' },
        prepare: { type: 'string' },
        seed: { type: 'string' },
        'server-pid': { type: 'string' },
        'worker-pid': { type: 'string' },
        'db-pid': { type: 'string' },
        documents: { type: 'boolean' },
        probes: { type: 'string' },
        'reader-accounts': { type: 'string' },
        'report-only': { type: 'boolean' },
        help: { type: 'boolean' },
      },
    }));
  } catch (error) {
    return { ok: false, message: `${(error as Error).message}\n${USAGE}`, exitCode: 2 };
  }
  if (values.help) return { ok: false, message: USAGE, exitCode: 0 };
  const parsed = schema.safeParse({
    url: values.url,
    readers: values.readers,
    importers: values.importers,
    durationS: values.duration,
    warmUpS: values['warm-up'],
    readRate: values['read-rate'],
    importRate: values['import-rate'],
    plates: values.plates,
    p95LimitMs: values['p95-limit'],
    timeoutS: values.timeout,
    importTimeoutS: values['import-timeout'],
    grow: values.grow,
    prepare: values.prepare,
    seed: values.seed,
    serverPid: values['server-pid'],
    workerPid: values['worker-pid'],
    dbPid: values['db-pid'],
    documents: values.documents,
    probes: values.probes,
    readerAccounts: values['reader-accounts'],
    reportOnly: values['report-only'],
  });
  if (!parsed.success) {
    const lines = parsed.error.issues.map(
      (issue) => `--${FLAGS[String(issue.path[0])] ?? String(issue.path[0])}: ${issue.message}`,
    );
    return { ok: false, message: `${lines.join('\n')}\n${USAGE}`, exitCode: 2 };
  }
  const options = parsed.data;
  return {
    ok: true,
    options: {
      ...options,
      readRate: options.readRate ?? options.readers,
      prepare: options.prepare ?? 1 + options.grow + expectedImports(options),
      seed: options.seed ?? Date.now() % 2 ** 31,
    },
  };
}
