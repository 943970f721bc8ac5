// Gatewell job worker: takes import, fit and forecast jobs from the queue in PostgreSQL until stopped.
// Start as many as you like, on this machine or others that reach the database (docs/operations.md, "Topology"):
//   DATABASE_URL=postgres://… SESSION_SECRET=… node --conditions=react-server --import tsx scripts/worker.ts [--fits N] [--forecasts N] [--imports N] [--nice N] [--scheduling idle|nice]
// --fits, --forecasts and --imports set how many jobs of each kind this process runs at once (default 2, 2, 1).
// --nice sets the nice value of the process and of the PostgreSQL sessions it opens on this machine
// (default 19, the lowest priority; 0 with --scheduling nice keeps the normal one), so that a worker beside
// the web server on one machine takes only the CPU that people's page requests leave. --scheduling idle
// (the default on Linux) also puts the process and those sessions in the kernel's SCHED_IDLE class through
// chrt(1), so that a page request takes a core from the worker the moment it wakes; --scheduling nice keeps
// the nice value alone.
// SIGINT/SIGTERM stop it gracefully: jobs under way finish, waiting jobs stay for other workers.
import { parseArgs } from 'node:util';
import { runInBackground } from '../lib/jobs/background-priority';
import { closeForecastPool } from '../lib/compute/forecast-pool';
import { startJobWorkers, stopJobWorkers } from '../lib/jobs/worker';

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      fits: { type: 'string', default: '2' },
      forecasts: { type: 'string', default: '2' },
      imports: { type: 'string', default: '1' },
      nice: { type: 'string', default: '19' },
      scheduling: { type: 'string', default: 'idle' },
    },
  });
  const count = (name: string, text: string) => {
    const n = Number(text);
    if (!Number.isInteger(n) || n < 0 || n > 16)
      throw new Error(`--${name} must be a whole number from 0 to 16`);
    return n;
  };
  const niceness = Number(values.nice);
  if (!Number.isInteger(niceness) || niceness < 0 || niceness > 19)
    throw new Error('--nice must be a whole number from 0 to 19');
  if (values.scheduling !== 'idle' && values.scheduling !== 'nice')
    throw new Error('--scheduling must be idle or nice');
  const priority = runInBackground(niceness, { idle: values.scheduling === 'idle' });
  const fits = count('fits', values.fits);
  const forecasts = count('forecasts', values.forecasts);
  const imports = count('imports', values.imports);
  await startJobWorkers({
    concurrency: {
      'plate-fits': fits,
      forecast: forecasts,
      'plate-forecasts': forecasts > 0 ? 1 : 0,
      'plate-import': imports,
    },
  });
  console.log(
    `gatewell worker ${process.pid}: taking jobs (imports ×${imports}, fits ×${fits}, forecasts ×${forecasts}, ${describePriority(priority, values.scheduling === 'idle')})`,
  );
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`gatewell worker ${process.pid}: ${signal}, finishing jobs under way`);
    await stopJobWorkers();
    await closeForecastPool();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

function describePriority(priority: ReturnType<typeof runInBackground>, idleAsked: boolean): string {
  if (!priority) return 'priority unchanged: refused by the system';
  if (priority.idle) return `nice ${priority.niceness}, SCHED_IDLE`;
  return `nice ${priority.niceness}${idleAsked ? ', SCHED_IDLE refused or chrt missing' : ''}`;
}

main().catch((error: unknown) => {
  console.error(`gatewell worker: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
