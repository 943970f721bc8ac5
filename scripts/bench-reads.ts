// Server cost of each read of the load test, one route at a time: signs in, sends N requests one after
// another to each route and prints wall time per answer and the server's CPU per answer (Linux /proc).
// With --probes (the file the scale fill writes) it reads the scale test's plate, a compound's profile,
// the three audit searches, a later plate-list page and the audit filter's suggestions too, signed in as
// the approver (who may read the audit trail).
// Usage: node --import tsx scripts/bench-reads.ts --url http://127.0.0.1:4340 --server-pid PID [--count 100]
//        [--only ROUTE] [--probes .var/scale/probes.json]
import { readFileSync } from 'node:fs';
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
    probes: { type: 'string' },
  },
});
const baseUrl = values.url;
const count = Number(values.count);
const pid = values['server-pid'] ? Number(values['server-pid']) : null;

async function main() {
  const probes = values.probes
    ? (JSON.parse(readFileSync(values.probes, 'utf8')) as {
        plateIds: string[];
        compoundIds: string[];
        approverIds: string[];
      })
    : null;
  const cookie = await signIn(baseUrl, probes ? DEMO_ACCOUNTS[3] : DEMO_ACCOUNTS[1]);
  const [plateId] = probes ? probes.plateIds : await listedPlateIds(baseUrl, cookie);
  if (!plateId) throw new Error('the plate list is empty');
  const day = (offset: number) => new Date(Date.now() - offset * 86_400_000).toISOString().slice(0, 10);
  const scale = probes
    ? [
        `/compounds/${probes.compoundIds[0]}/profile`,
        '/audit',
        `/audit?entityType=plate&entityId=${plateId}`,
        `/audit?userId=${probes.approverIds[0]}&from=${day(30)}&to=${day(-1)}`,
        '/plates?page=40',
        '/api/audit/suggestions?kind=compound&q=GW-01',
      ]
    : [];
  const name = (route: string) =>
    route
      .replace(plateId, '[id]')
      .replace(probes?.compoundIds[0] ?? '-', '[id]')
      .replace(probes?.approverIds[0] ?? '-', '[user]')
      .replace(/from=[\d-]+&to=[\d-]+/, 'from=…&to=…');
  const routes = [
    '/api/health',
    '/plates',
    `/plates/${plateId}`,
    `/api/plates/${plateId}/wells`,
    `/plates/${plateId}/fits`,
    `/api/plates/${plateId}/fits`,
    `/plates/${plateId}/history`,
    ...scale,
  ];

  console.log(
    `route cost over ${count} requests one after another (${baseUrl}, plate ${plateId}; load average ${readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ')})`,
  );
  for (const route of routes.filter((r) => !values.only || name(r) === values.only)) {
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
    const load = readFileSync('/proc/loadavg', 'utf8').split(' ')[0];
    const wall = (performance.now() - started) / count;
    const cpuAfter = pid ? cpuSeconds(pid) : null;
    const cpu =
      cpuBefore !== null && cpuAfter !== null
        ? `${(((cpuAfter - cpuBefore) * 1000) / count).toFixed(1).padStart(6)} ms CPU`
        : '';
    console.log(
      `  ${name(route).padEnd(44)} ${wall.toFixed(1).padStart(6)} ms wall ${cpu}  ${String(Math.round(bytes / count / 1024)).padStart(5)} KB  (load ${load})`,
    );
  }
}

main().catch((error: unknown) => {
  console.error(`bench-reads: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(2);
});
