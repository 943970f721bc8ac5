// Fills a database of its own with a year of invented plates (scripts/scale/fill.ts) and prints what it
// wrote and how long it took. Needs the demo users (seeders/20261201000100-demo-users.js). Usually run by
// scripts/scale-test.sh; by hand, against a database that holds nothing you need:
//   DATABASE_URL=… node --conditions=react-server --import tsx scripts/scale-fill.ts [--plates 5000] …
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { availableParallelism, loadavg } from 'node:os';
import { QueryTypes } from 'sequelize';
import { z } from 'zod';
import { db } from '@/lib/db';
import { fillScale } from './scale/fill';

const USAGE = `usage: node --conditions=react-server --import tsx scripts/scale-fill.ts [options]
  --plates N            plates of 384 wells (default 5000)
  --compounds N         compounds in the registry (default 2000); each is on plates × 80 / N plates
  --screens N           screens, two targets each (default 4)
  --templates N         template plates analysed by Gatewell's science and copied onto the plates (default 16)
  --batch N             plates written per transaction (default 250)
  --forecasts N         forecasts computed by the forecast service on approved plates (default 40)
  --hash-concurrency N  connections working out signed content hashes side by side (default 4)
  --writers N           connections writing batches of plates side by side (default 2)
  --tag T               letters and digits that tell this fill's names and ids apart (default from the clock)
  --probes FILE         writes the ids the load test reads (default .var/scale/probes.json)`;

const schema = z.object({
  plates: z.coerce.number().int().min(1).max(100_000).default(5000),
  compounds: z.coerce.number().int().min(80).max(100_000).default(2000),
  screens: z.coerce.number().int().min(1).max(50).default(4),
  templates: z.coerce.number().int().min(1).max(200).default(16),
  batch: z.coerce.number().int().min(1).max(5000).default(250),
  forecasts: z.coerce.number().int().min(0).max(10_000).default(40),
  hashConcurrency: z.coerce.number().int().min(1).max(8).default(4),
  writers: z.coerce.number().int().min(1).max(8).default(2),
  tag: z
    .string()
    .regex(/^[a-z0-9]{1,8}$/, 'use 1–8 lower-case letters or digits')
    .default(() => Date.now().toString(36).slice(-5)),
  probes: z.string().default('.var/scale/probes.json'),
});

async function main(): Promise<number> {
  const { values } = parseArgs({
    options: {
      plates: { type: 'string' },
      compounds: { type: 'string' },
      screens: { type: 'string' },
      templates: { type: 'string' },
      batch: { type: 'string' },
      forecasts: { type: 'string' },
      'hash-concurrency': { type: 'string' },
      writers: { type: 'string' },
      tag: { type: 'string' },
      probes: { type: 'string' },
      help: { type: 'boolean' },
    },
  });
  if (values.help) {
    console.log(USAGE);
    return 0;
  }
  const parsed = schema.safeParse({ ...values, hashConcurrency: values['hash-concurrency'] });
  if (!parsed.success) {
    console.error(
      `${parsed.error.issues.map((i) => `--${String(i.path[0])}: ${i.message}`).join('\n')}\n${USAGE}`,
    );
    return 2;
  }
  const options = parsed.data;
  console.log(
    `scale fill: ${options.plates} plates of 384 wells, ${options.compounds} compounds, ${options.screens} screens (tag ${options.tag}); ` +
      `${availableParallelism()} cores, 1-minute load average ${loadavg()[0]!.toFixed(2)}`,
  );
  const start = performance.now();
  const result = await fillScale({ ...options, log: (line) => console.log(line) });
  const total = (performance.now() - start) / 1000;
  const [counts] = await db().query(
    `select (select count(*) from plates) as plates, (select count(*) from wells) as wells, (select count(*) from readouts) as readouts,
            (select count(*) from fits) as fits, (select count(*) from forecasts) as forecasts, (select count(*) from signatures) as signatures,
            (select count(*) from signoff_events) as "signoffEvents", (select count(*) from audit_events) as "auditEvents",
            (select pg_size_pretty(pg_database_size(current_database()))) as size`,
    { type: QueryTypes.SELECT },
  );
  const [states] = await db().query(
    `select string_agg(state || ' ' || n, ', ' order by state) as states from (select state, count(*) n from plates group by state) s`,
    { type: QueryTypes.SELECT },
  );
  console.log(`rows: ${JSON.stringify(counts)}`);
  console.log(`plates by state: ${(states as { states: string }).states}`);
  console.log(
    `fill time ${total.toFixed(1)} s (${Object.entries(result.seconds)
      .map(([k, v]) => `${k} ${v.toFixed(1)} s`)
      .join(', ')}); 1-minute load average ${loadavg()[0]!.toFixed(2)} at the end`,
  );
  mkdirSync(path.dirname(options.probes), { recursive: true });
  writeFileSync(
    options.probes,
    `${JSON.stringify(
      {
        plateIds: result.plateIds.filter(
          (_, i) => i % Math.max(1, Math.floor(result.plateIds.length / 50)) === 0,
        ),
        compoundIds: result.compoundIds.slice(0, 50),
        approverIds: result.approverIds,
      },
      null,
      2,
    )}\n`,
  );
  console.log(`ids for the load test in ${options.probes}`);
  await db().close();
  return 0;
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error(`scale fill: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    process.exit(1);
  },
);
