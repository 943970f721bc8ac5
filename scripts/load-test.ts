// Gatewell load test: signed-in people reading plates while biologists import plate exports, against a
// running production build. Prints latency percentiles, errors and requests per second for reads and
// imports, and exits 1 when reads miss p95 < 100 ms or any request fails (--report-only: always 0).
// Usually run by scripts/load-test.sh, which sets up its own database and server:
//   node --import tsx scripts/load-test.ts [--url http://127.0.0.1:4340] [--readers 50] [--importers 5] …
import { availableParallelism, loadavg } from 'node:os';
import { prepareCommits, type CommitSource } from './load/commit-source';
import { readerWalk, type Read } from './load/reader-walk';
import { listedPlateIds } from './load/discover';
import { scaleReads } from './load/scale-reads';
import { parseOptions, type LoadOptions } from './load/options';
import { runGroup, type ScheduledRequest, type Tally } from './load/run-people';
import { cpuNow, cpuSince, type CpuUse } from './load/server-cpu';
import { DEMO_ACCOUNTS, signIn, type DemoAccount } from './load/sign-in';
import { groupFigures, groupLine, missedTargets, routeFigures, routeLine } from './load/summary';

const BIOLOGIST = DEMO_ACCOUNTS.find((account) => account.email.startsWith('biologist'))!;

/** Signs every account in, five at a time (each sign-in is one argon2 verification on the server). */
async function signInAll(baseUrl: string, accounts: DemoAccount[]): Promise<string[]> {
  const cookies: string[] = [];
  for (let i = 0; i < accounts.length; i += 5)
    cookies.push(...(await Promise.all(accounts.slice(i, i + 5).map((a) => signIn(baseUrl, a)))));
  return cookies;
}

/** Readers in turn, each walking the sequence from its own starting point. */
function readSchedule(cookies: string[], sequence: Read[]): () => ScheduledRequest {
  const cursors = cookies.map((_, i) => i % sequence.length);
  let person = 0;
  return () => {
    const p = person;
    person = (person + 1) % cookies.length;
    const read = sequence[cursors[p]!]!;
    cursors[p] = (cursors[p]! + 1) % sequence.length;
    return { ...read, cookie: cookies[p]! };
  };
}

/** Importers in turn, each request carrying the next distinct export. */
function importSchedule(cookies: string[], source: CommitSource): () => ScheduledRequest {
  let person = 0;
  return () => {
    const { body, contentType } = source.next();
    person = (person + 1) % cookies.length;
    return {
      route: 'POST /api/imports/commit',
      path: '/api/imports/commit',
      method: 'POST',
      cookie: cookies[person]!,
      body,
      contentType,
    };
  };
}

/** One pass over a plate's reads and one import before the clock starts, so that cold module loads are not measured. */
async function warmUp(
  baseUrl: string,
  cookie: string,
  reads: Read[],
  importer: string | null,
  source: CommitSource | null,
) {
  for (const read of reads.slice(0, 7)) {
    const answer = await fetch(new URL(read.path, baseUrl), {
      headers: { ...read.headers, cookie },
      redirect: 'manual',
    });
    await answer.arrayBuffer();
    if (answer.status !== 200) throw new Error(`warm-up ${read.path} answered ${answer.status}`);
  }
  if (!importer || !source) return;
  const { body, contentType } = source.next();
  const answer = await fetch(new URL('/api/imports/commit', baseUrl), {
    method: 'POST',
    body: new Uint8Array(body),
    headers: { cookie: importer, origin: new URL(baseUrl).origin, 'content-type': contentType },
  });
  if (answer.status !== 201)
    throw new Error(`warm-up import answered ${answer.status}: ${await answer.text()}`);
}

/** Imports `count` exports before the clock starts, one session each at a time, so that reads meet a longer plate list. */
async function grow(baseUrl: string, cookies: string[], source: CommitSource, count: number): Promise<void> {
  let left = count;
  const origin = new URL(baseUrl).origin;
  await Promise.all(
    cookies.map(async (cookie) => {
      while (left > 0) {
        left -= 1;
        const { body, contentType } = source.next();
        const answer = await fetch(new URL('/api/imports/commit', baseUrl), {
          method: 'POST',
          body: new Uint8Array(body),
          headers: { cookie, origin, 'content-type': contentType },
        });
        if (answer.status !== 201)
          throw new Error(`an import before the run answered ${answer.status}: ${await answer.text()}`);
      }
    }),
  );
}

function describe(options: LoadOptions, plates: number, reads: number, prepared: number): string {
  const pace =
    options.readRate > 0
      ? `${options.readRate} reads/s in all (one read per reader every ${(options.readers / options.readRate).toFixed(1)} s)`
      : 'each reader sending the next read as soon as the answer arrives';
  const importPace =
    options.importRate > 0 ? `in turn, ${options.importRate} import(s)/s in all` : 'back to back';
  return [
    `Gatewell load test against ${options.url} for ${options.durationS} s after ${options.warmUpS} s of the same load unmeasured`,
    `  reads:   ${options.readers} signed-in readers (sessions of ${options.readerAccounts ?? `the ${DEMO_ACCOUNTS.length} demo users`} in turn), ${pace}, each walking ${reads} reads over ${plates} plate(s)`,
    `           ${options.documents ? 'every page loaded as a document' : 'the plate list loaded as a document, then client-side navigations (RSC requests) as a browser makes them'}, and the JSON the pages fetch`,
    `  imports: ${options.importers} biologist session(s) posting distinct plate exports ${importPace} (${prepared} encoded ahead, seed ${options.seed})`,
    ...(options.grow
      ? [
          `  before:  ${options.grow} exports imported before the clock started, so the plate list is that much longer`,
        ]
      : []),
    ...(options.probes
      ? [
          `  scale:   after each plate a compound profile, three audit searches and a later plate-list page (ids from ${options.probes})`,
        ]
      : []),
    `  machine: ${availableParallelism()} cores, 1-minute load average ${loadavg()[0]!.toFixed(2)} before the run (the load generator shares the machine)`,
  ].join('\n');
}

/** Lines on CPU during the load: the web server (and the processes below it), a job worker, the whole machine. */
function cpuLines(cpu: CpuUse, reads: Tally, imports: Tally | null): string[] {
  const seconds = Math.max(reads.seconds, imports?.seconds ?? 0);
  const answers = reads.samples.length + (imports?.samples.length ?? 0);
  const share = (s: number) =>
    `${s.toFixed(1)} s CPU in ${seconds.toFixed(1)} s of load (${((100 * s) / seconds).toFixed(0)} % of one core)`;
  return [
    ...(cpu.server !== null
      ? [
          `  web server: ${share(cpu.server)}, ${answers ? ((1000 * cpu.server) / answers).toFixed(1) : '—'} ms per answer`,
        ]
      : []),
    ...(cpu.worker !== null ? [`  job worker: ${share(cpu.worker)}`] : []),
    ...(cpu.database !== null
      ? [
          `  PostgreSQL: ${share(cpu.database)}, ${answers ? ((1000 * cpu.database) / answers).toFixed(1) : '—'} ms per answer`,
        ]
      : []),
    ...(cpu.machine !== null
      ? [`  machine:    ${(100 * cpu.machine).toFixed(0)} % of its ${availableParallelism()} cores busy`]
      : []),
    ...(cpu.busiest.length
      ? [
          `  busiest:    ${cpu.busiest.map(([name, s]) => `${name} ${((100 * s) / seconds).toFixed(0)} %`).join(', ')} (of one core)`,
        ]
      : []),
  ];
}

function report(
  reads: Tally,
  imports: Tally | null,
  source: CommitSource | null,
  options: LoadOptions,
  cpu: CpuUse,
): boolean {
  const readFigures = options.readers ? groupFigures(reads) : null;
  const importFigures = imports && groupFigures(imports);
  console.log('');
  if (readFigures) console.log(groupLine('reads', readFigures));
  for (const [route, figures] of routeFigures(reads.samples)) console.log(routeLine(route, figures));
  if (importFigures) console.log(groupLine('imports', importFigures));
  if (source?.builtDuringRun())
    console.log(`  ${source.builtDuringRun()} export(s) were built during the run (raise --prepare)`);
  for (const refusal of [...reads.firstRefusals, ...(imports?.firstRefusals ?? [])])
    console.log(`  refused: ${refusal}`);
  for (const line of cpuLines(cpu, reads, imports)) console.log(line);
  console.log(`  1-minute load average ${loadavg()[0]!.toFixed(2)} at the end`);
  const missed = missedTargets(readFigures, importFigures, options.p95LimitMs);
  const met = readFigures ? `reads p95 < ${options.p95LimitMs} ms, no errors` : 'no errors';
  console.log(missed.length ? `\ntargets missed: ${missed.join('; ')}` : `\ntargets met: ${met}`);
  return missed.length === 0;
}

async function main(): Promise<number> {
  const parsed = parseOptions(process.argv.slice(2));
  if (!parsed.ok) {
    (parsed.exitCode ? console.error : console.log)(parsed.message);
    return parsed.exitCode;
  }
  const { options } = parsed;
  const health = await fetch(new URL('/api/health', options.url));
  if (health.status !== 200) throw new Error(`${options.url}/api/health answered ${health.status}`);

  const accounts = options.readerAccounts
    ? options.readerAccounts.split(',').map((name) => {
        const account = DEMO_ACCOUNTS.find((a) => a.email.split('@')[0] === name);
        if (!account) throw new Error(`--reader-accounts: no demo account ${name}`);
        return account;
      })
    : DEMO_ACCOUNTS;
  const readerCookies = await signInAll(
    options.url,
    Array.from({ length: options.readers }, (_, i) => accounts[i % accounts.length]!),
  );
  const importerCookies = await signInAll(
    options.url,
    Array.from({ length: Math.max(options.importers, options.grow ? 1 : 0) }, () => BIOLOGIST),
  );
  const plateIds = (await listedPlateIds(options.url, readerCookies[0] ?? importerCookies[0] ?? '')).slice(
    0,
    options.plates,
  );
  if (plateIds.length === 0) throw new Error('the plate list is empty: seed the demo data first');
  const walk = await readerWalk(options.url, readerCookies[0] ?? importerCookies[0]!, plateIds, {
    documents: options.documents,
  });
  // With a probes file, each plate's seven reads are followed by the reads a year of data adds.
  const extra = options.probes ? scaleReads(options.probes, plateIds.length) : null;
  const sequence = extra
    ? walk.flatMap((read, i) => (i % 7 === 6 ? [read, ...extra[(i - 6) / 7]!] : [read]))
    : walk;
  const source =
    importerCookies.length > 0
      ? await prepareCommits({
          baseUrl: options.url,
          cookie: importerCookies[0]!,
          prepare: options.prepare,
          firstSeed: options.seed,
          tag: `LOAD-${options.seed.toString(36).toUpperCase()}`,
        })
      : null;
  await warmUp(
    options.url,
    readerCookies[0] ?? importerCookies[0]!,
    sequence,
    importerCookies[0] ?? null,
    source,
  );
  if (source && options.grow) await grow(options.url, importerCookies, source, options.grow);
  console.log(describe(options, plateIds.length, sequence.length, source?.prepared ?? 0));

  const load = (durationS: number) => {
    const group = { baseUrl: options.url, durationS };
    return Promise.all([
      readerCookies.length
        ? runGroup(readSchedule(readerCookies, sequence), {
            ...group,
            timeoutS: options.timeoutS,
            connections: options.readRate || options.readers,
            ratePerConnection: options.readRate ? 1 : 0,
          })
        : Promise.resolve({ samples: [], socketErrors: 0, timeouts: 0, seconds: 0, firstRefusals: [] }),
      source && options.importers
        ? runGroup(importSchedule(importerCookies, source), {
            ...group,
            timeoutS: options.importTimeoutS,
            connections: options.importRate || options.importers,
            ratePerConnection: options.importRate ? 1 : 0,
          })
        : Promise.resolve(null),
    ]);
  };
  // The same load, unmeasured, over as many connections as the run: every web process compiles its hot code.
  if (options.warmUpS) await load(options.warmUpS);
  const cpuBefore = cpuNow(options);
  const [reads, imports] = await load(options.durationS);
  const met = report(reads, imports, source, options, cpuSince(cpuBefore, cpuNow(options)));
  return met || options.reportOnly ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    const cause = error instanceof Error && error.cause instanceof Error ? ` (${error.cause.message})` : '';
    console.error(`load test: ${error instanceof Error ? error.message : String(error)}${cause}`);
    process.exit(2);
  },
);
