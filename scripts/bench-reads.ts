// Server cost of each read of the load test, one route at a time: signs in, sends N requests one after
// another to each route and prints wall time per answer and the server's CPU per answer (Linux /proc).
// Usage: node --import tsx scripts/bench-reads.ts --url http://127.0.0.1:4340 --server-pid PID [--count 100]
import { parseArgs } from 'node:util';
import { listedPlateIds } from './load/discover';
import { cpuSeconds } from './load/server-cpu';
import { DEMO_ACCOUNTS, signIn } from './load/sign-in';

const { values } = parseArgs({
  options: {
    url: { type: 'string', default: 'http://127.0.0.1:4340' },
    'server-pid': { type: 'string' },
    count: { type: 'string', default: '100' },
    only: { type: 'string' },
  },
});
const baseUrl = values.url;
const count = Number(values.count);
const pid = values['server-pid'] ? Number(values['server-pid']) : null;

async function main() {
  const cookie = await signIn(baseUrl, DEMO_ACCOUNTS[1]);
  const [plateId] = await listedPlateIds(baseUrl, cookie);
  if (!plateId) throw new Error('the plate list is empty');
  const routes = [
    '/api/health',
    '/plates',
    `/plates/${plateId}`,
    `/api/plates/${plateId}/wells`,
    `/plates/${plateId}/fits`,
    `/api/plates/${plateId}/fits`,
    `/plates/${plateId}/history`,
  ];

  console.log(`route cost over ${count} requests one after another (${baseUrl}, plate ${plateId})`);
  for (const route of routes.filter((r) => !values.only || r.replace(plateId, '[id]') === values.only)) {
    for (let i = 0; i < 5; i++)
      await (
        await fetch(new URL(route, baseUrl), { headers: { cookie, 'accept-encoding': 'identity' } })
      ).arrayBuffer();
    const cpuBefore = pid ? cpuSeconds(pid) : null;
    const started = performance.now();
    let bytes = 0;
    for (let i = 0; i < count; i++) {
      const answer = await fetch(new URL(route, baseUrl), {
        headers: { cookie, 'accept-encoding': 'identity' },
      });
      if (!answer.ok) throw new Error(`GET ${route} answered ${answer.status}`);
      bytes += (await answer.arrayBuffer()).byteLength;
    }
    const wall = (performance.now() - started) / count;
    const cpuAfter = pid ? cpuSeconds(pid) : null;
    const cpu =
      cpuBefore !== null && cpuAfter !== null
        ? `${(((cpuAfter - cpuBefore) * 1000) / count).toFixed(1).padStart(6)} ms CPU`
        : '';
    console.log(
      `  ${route.replace(plateId, '[id]').padEnd(28)} ${wall.toFixed(1).padStart(6)} ms wall ${cpu}  ${Math.round(bytes / count / 1024)} KB`,
    );
  }
}

main().catch((error: unknown) => {
  console.error(`bench-reads: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(2);
});
