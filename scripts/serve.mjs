// Gatewell's production web server: the built app (`next build`) served by one or more processes that
// share one port (Node's cluster module hands each new connection to the next process in turn).
//   node scripts/serve.mjs [--port 4310] [--hostname 127.0.0.1] [--processes N]
// --processes defaults to GATEWELL_WEB_PROCESSES, else one per core (at most 4). A process that dies is
// started again. Each process runs what `next start` runs, instrumentation.ts included (the mail sender,
// and job workers unless GATEWELL_JOB_WORKER=off); everything they share lives in PostgreSQL.
import cluster from 'node:cluster';
import http from 'node:http';
import { availableParallelism } from 'node:os';
import { parseArgs } from 'node:util';

// As `next start` does: the production builds of React and Next, chosen when they are first imported.
process.env.NODE_ENV = 'production';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: process.env.PORT ?? '4310' },
    hostname: { type: 'string', default: '127.0.0.1' },
    processes: {
      type: 'string',
      default: process.env.GATEWELL_WEB_PROCESSES ?? String(Math.min(4, availableParallelism())),
    },
  },
});
const port = Number(values.port);
const processes = Number(values.processes);
if (!Number.isInteger(port) || port < 1 || port > 65535) throw new Error('--port must be a port number');
if (!Number.isInteger(processes) || processes < 1 || processes > 64)
  throw new Error('--processes must be a whole number from 1 to 64');

if (processes > 1 && cluster.isPrimary) {
  cluster.schedulingPolicy = cluster.SCHED_RR;
  let stopping = false;
  for (let i = 0; i < processes; i++) cluster.fork();
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) return;
    console.error(`gatewell web process ${worker.process.pid} ended (${signal ?? code}); starting another`);
    // Once its channel is closed the cluster hands it no more connections; start the replacement then.
    if (worker.isConnected()) worker.once('disconnect', () => cluster.fork());
    else cluster.fork();
  });
  const stop = (signal) => {
    stopping = true;
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill(signal);
    setTimeout(() => process.exit(0), 10_000).unref();
    cluster.on('exit', () => {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
    });
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
} else {
  const { default: next } = await import('next');
  const app = next({ dev: false, hostname: values.hostname, port });
  await app.prepare();
  const handle = app.getRequestHandler();
  const server = http.createServer((request, response) => void handle(request, response));
  server.keepAliveTimeout = 65_000;
  if (process.env.GATEWELL_LOOP_REPORT) {
    const { monitorEventLoopDelay } = await import('node:perf_hooks');
    const delay = monitorEventLoopDelay({ resolution: 10 });
    delay.enable();
    let cpu = process.cpuUsage();
    setInterval(() => {
      const used = process.cpuUsage(cpu);
      cpu = process.cpuUsage();
      console.log(
        `loop ${process.pid}: delay p50 ${(delay.percentile(50) / 1e6).toFixed(0)} p99 ${(delay.percentile(99) / 1e6).toFixed(0)} max ${(delay.max / 1e6).toFixed(0)} ms, cpu ${((used.user + used.system) / 50000).toFixed(0)} %`,
      );
      delay.reset();
    }, 5000).unref();
  }
  server.listen(port, values.hostname, () => {
    console.log(`gatewell web process ${process.pid}: serving http://${values.hostname}:${port}`);
  });
  const stop = () => server.close(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}
