// Gatewell job worker: takes import, fit and forecast jobs from the queue in PostgreSQL until stopped.
// Start as many as you like, on this machine or others that reach the database (README, "Topology"):
//   DATABASE_URL=postgres://… SESSION_SECRET=… node --conditions=react-server --import tsx scripts/worker.ts [--fits N] [--forecasts N] [--imports N] [--nice N]
// --fits, --forecasts and --imports set how many jobs of each kind this process runs at once (default 2, 2, 1).
// --nice sets the nice value of the process and of the PostgreSQL sessions it opens on this machine (default
// 19, the lowest priority; 0 keeps the normal one), so that a worker beside the web server on one machine
// takes only the CPU that people's page requests leave.
// SIGINT/SIGTERM stop it gracefully: jobs under way finish, waiting jobs stay for other workers.
import { parseArgs } from 'node:util';
import { runInBackground } from '../lib/jobs/background-priority';
import { closeForecastPool } from '../lib/science/forecast/pool';
import { startJobWorkers, stopJobWorkers } from '../lib/jobs/worker';

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { fits: { type: 'string', default: '2' }, forecasts: { type: 'string', default: '2' }, imports: { type: 'string', default: '1' }, nice: { type: 'string', default: '19' } } });
  const count = (name: string, text: string) => {
    const n = Number(text);
    if (!Number.isInteger(n) || n < 0 || n > 16) throw new Error(`--${name} must be a whole number from 0 to 16`);
    return n;
  };
  const niceness = Number(values.nice);
  if (!Number.isInteger(niceness) || niceness < 0 || niceness > 19) throw new Error('--nice must be a whole number from 0 to 19');
  const nice = runInBackground(niceness);
  const fits = count('fits', values.fits);
  const forecasts = count('forecasts', values.forecasts);
  const imports = count('imports', values.imports);
  await startJobWorkers({ concurrency: { 'plate-fits': fits, forecast: forecasts, 'plate-forecasts': forecasts > 0 ? 1 : 0, 'plate-import': imports } });
  console.log(`gatewell worker ${process.pid}: taking jobs (imports ×${imports}, fits ×${fits}, forecasts ×${forecasts}, nice ${nice ?? 'unchanged: refused by the system'})`);
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

main().catch((error: unknown) => {
  console.error(`gatewell worker: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
