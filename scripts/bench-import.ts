// Gatewell import benchmark: one 1536-well export in the long layout (a row per well and target, four
// targets: 6 144 rows) from upload to fitted plate, each stage timed: read (the upload parsed in a worker
// thread), check (mapping guessed, every row validated against the screen's registry), store (file,
// plate, wells, readouts, QC, block, Z′, the queued fit job, in one transaction) and fit (every Hill fit
// of the plate, as the plate-fits job does it). Targets: under 5 s in all, peak memory under 300 MB.
// Prints figures; checks nothing. Every write is rolled back, so it can run on the demo database:
//   DATABASE_URL=$(bash scripts/pg.sh url dev) SESSION_SECRET=… \
//     node --conditions=react-server --import tsx scripts/bench-import.ts [repeats] [--xlsx|--csv]
// It needs the demo compounds and a biologist (the seeded demo data); the bench's own four-target screen
// is made inside the transaction that is rolled back. The export is written in memory from invented
// numbers (seeded, so every run reads the same file).
// Peak memory is the process's peak resident set size (getrusage maxrss): the main thread, the parse
// worker thread and the fit, which here runs in this process (in the app a job worker process runs it; its
// share is in the fit stage's figure). PostgreSQL's own processes are not counted in it. Beside the wall
// times it prints the CPU each stage took in this process and in the PostgreSQL backend serving it (read
// from /proc when the server runs on this machine): on a shared machine the wall times also wait for a core.
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { QueryTypes } from 'sequelize';
import { loadActor } from '@/lib/auth/load-actor';
import { db } from '@/lib/db';
import { guessMapping } from '@/lib/imports/guess-mapping';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';
import { closeJobQueue } from '@/lib/jobs/queue';
import { refitPlate } from '@/lib/plates/recompute';
import { storePlate } from '@/lib/plates/store';
import { Compound, Fit, Screen, Target, UserRole } from '@/models';
import XLSX from 'xlsx';
import { wellLabel } from '@/lib/imports/plate-format';
import { DEMO_COMPOUNDS, trueBlock, type TruePotency } from './demo-plates/demo-compounds';
import { clamp, makeRandom, roundTo } from './demo-plates/random';

/**
 * The bench screen's four targets (invented potencies: Nav1.7 and Kv7.2 those of the demo compounds,
 * the other two derived from them) and their median control currents (pA, sign as recorded).
 */
const BENCH_TARGETS = [
  { name: 'Nav1.7', conductance: 'gNa', control_pA: -2500, potency: (c: Potencies) => c['Nav1.7'] },
  { name: 'Kv7.2', conductance: 'gM', control_pA: 1800, potency: (c: Potencies) => c['Kv7.2'] },
  {
    name: 'Nav1.8',
    conductance: 'gNa',
    control_pA: -1500,
    potency: (c: Potencies) => ({ ...c['Nav1.7'], ic50_uM: c['Nav1.7'].ic50_uM * 4 }),
  },
  {
    name: 'Kv2.1',
    conductance: 'gK',
    control_pA: 2200,
    potency: (c: Potencies) => ({ ...c['Kv7.2'], ic50_uM: c['Kv7.2'].ic50_uM / 3 }),
  },
] as const;
type Potencies = (typeof DEMO_COMPOUNDS)[number]['truth'];

const HEADER = [
  'Well',
  'Role',
  'Compound',
  'Conc (uM)',
  'Target',
  'I control (pA)',
  'I compound (pA)',
  'Rseal (GOhm)',
  'Rs (MOhm)',
  'Cm (pF)',
];
const SERIES_UM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];

interface BenchExport {
  filename: string;
  bytes: Uint8Array;
  rows: number;
}

/**
 * The bench's export, written in memory from invented numbers (seeded): a 1536-well plate (32 × 48),
 * vehicle in columns 1–2, a reference blocker in 47–48, the twelve demo compounds in turn over the 44
 * columns between, eight concentrations each (0.01–30 µM), one row per well and target.
 */
function writeBenchExport(kind: 'xlsx' | 'csv'): BenchExport {
  const random = makeRandom(1536_04);
  const rows: (string | number)[][] = [HEADER];
  for (let row = 0; row < 32; row += 1)
    for (let column = 0; column < 48; column += 1) {
      const well = wellLabel(row, column);
      const role = column < 2 ? 'Negative control' : column >= 46 ? 'Positive control' : 'Test';
      const index = row + 32 * (column - 2); // down the columns between the controls
      const compound =
        role === 'Test'
          ? DEMO_COMPOUNDS[Math.floor(index / SERIES_UM.length) % DEMO_COMPOUNDS.length]!
          : null;
      const concentration_uM =
        role === 'Test' ? SERIES_UM[index % SERIES_UM.length]! : role === 'Positive control' ? 1 : null;
      const seal = roundTo(clamp(random.logNormal(1.6, 0.3), 0.7, 6), 3);
      const series_MOhm = roundTo(clamp(random.logNormal(6, 0.3), 2, 15), 2);
      const capacitance = roundTo(clamp(random.logNormal(18, 0.3), 6, 45), 2);
      for (const target of BENCH_TARGETS) {
        const control = target.control_pA * clamp(random.logNormal(1, 0.3), 0.4, 3);
        const rundown = random.normal(0.95, 0.02);
        const ratio =
          role === 'Negative control'
            ? Math.max(0.86, rundown + random.normal(0, 0.025))
            : role === 'Positive control'
              ? random.normal(0.02, 0.015)
              : (1 - trueBlock(concentration_uM!, target.potency(compound!.truth) as TruePotency)) * rundown +
                random.normal(0, 0.025);
        rows.push([
          well,
          role,
          compound?.identifier ?? (role === 'Negative control' ? 'DMSO' : 'REF'),
          concentration_uM ?? '',
          target.name,
          roundTo(control, 1),
          roundTo(control * ratio + random.normal(0, 8), 1),
          seal,
          series_MOhm,
          capacitance,
        ]);
      }
    }
  const book = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(rows), 'Plate');
  const bytes =
    kind === 'csv'
      ? new TextEncoder().encode(rows.map((r) => r.join(',')).join('\n') + '\n')
      : new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer);
  return { filename: `bench-1536.${kind}`, bytes, rows: rows.length - 1 };
}

const STAGES = ['read', 'check', 'store', 'fit'] as const;
type Stage = (typeof STAGES)[number];

class Rollback extends Error {}

/** Peak resident set size of this process so far, MB (getrusage: every thread, the parse worker too). */
const peakRssMb = () => process.resourceUsage().maxRSS / 1024;

/** CPU of this process (every thread) spent in each stage, ms; kept beside the wall times. */
const cpuMs: Record<string, number[]> = {};
/** CPU of the PostgreSQL backend serving the bench's transaction in each stage, ms (when it runs here). */
const backendMs: Record<string, number[]> = {};
let backendPid: number | null = null;

/** user + system CPU of a process of this machine, ms (/proc/PID/stat, clock ticks of 10 ms); null if unreadable. */
function processCpuMs(pid: number | null): number | null {
  if (pid === null) return null;
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    // utime and stime are fields 14 and 15 of stat(5), here 12 and 13 after the command name.
    return (Number(fields[11]) + Number(fields[12])) * 10;
  } catch {
    return null;
  }
}

async function timed<T>(stage: Stage, work: () => Promise<T> | T): Promise<[T, number]> {
  const cpu = process.cpuUsage();
  const backend = processCpuMs(backendPid);
  const start = performance.now();
  const result = await work();
  const used = process.cpuUsage(cpu);
  (cpuMs[stage] ??= []).push((used.user + used.system) / 1000);
  const backendAfter = processCpuMs(backendPid);
  if (backend !== null && backendAfter !== null) (backendMs[stage] ??= []).push(backendAfter - backend);
  return [result, performance.now() - start];
}

interface Run {
  ms: Record<Stage, number>;
  /** Peak RSS (MB) at the end of each stage. */
  peakMb: Record<Stage, number>;
  wells: number;
  readouts: number;
  fits: number;
  fitted: number;
}

async function once(file: BenchExport): Promise<Run> {
  db(); // registers the models
  const biologist = await UserRole.findOne({
    attributes: ['userId'],
    where: { role: 'biologist' },
    raw: true,
  });
  const actor = biologist && (await loadActor(biologist.userId, '127.0.0.1'));
  if (!actor) throw new Error('no biologist in this database: seed it first');
  const ms = {} as Record<Stage, number>;
  const peakMb = {} as Record<Stage, number>;
  let counts = { wells: 0, readouts: 0, fits: 0, fitted: 0 };

  await db()
    .transaction(async (transaction) => {
      // The backend's process id, to read its CPU (a system function: no model says it).
      const [backend] = await db().query<{ pid: number }>('select pg_backend_pid() as pid', {
        transaction,
        type: QueryTypes.SELECT,
      });
      backendPid = backend?.pid ?? null;
      // The bench's own screen with four targets, made here and rolled back with the rest.
      const screen = await Screen.create(
        {
          name: `Bench four-target screen ${process.pid}`,
          neuronPreset: 'pospischil-rs-2008',
          createdBy: actor.id,
        },
        { transaction },
      );
      for (const target of BENCH_TARGETS)
        await Target.create(
          { screenId: screen.id, name: target.name, conductance: target.conductance },
          { transaction },
        );

      const [parsed, readMs] = await timed('read', () => parseSpreadsheet(file.bytes, file.filename));
      if (!parsed.ok) throw new Error(parsed.error.message);
      ms.read = readMs;
      peakMb.read = peakRssMb();

      const [preview, checkMs] = await timed('check', async () => {
        const sheet = parsed.sheets[0]!;
        const compounds = await Compound.findAll({ attributes: ['identifier'], raw: true, transaction });
        const { mapping } = guessMapping(sheet);
        return validatePlateSheet(sheet, mapping, {
          knownCompounds: compounds.map((c) => c.identifier),
          knownTargets: BENCH_TARGETS.map((t) => t.name),
          plateFormat: 1536,
        });
      });
      ms.check = checkMs;
      peakMb.check = peakRssMb();
      if (!preview.ok || !preview.plate)
        throw new Error(
          `the bench export did not validate: ${[...preview.fileProblems.map((p) => p.message), ...preview.issues.map((i) => i.message)][0]}`,
        );
      const plate = preview.plate;

      const [{ plateId }, storeMs] = await timed('store', () =>
        storePlate(
          actor,
          {
            screenId: screen.id,
            label: 'bench-1536',
            plate,
            file: { bytes: file.bytes, filename: file.filename, mediaType: 'application/octet-stream' },
          },
          transaction,
        ),
      );
      ms.store = storeMs;
      peakMb.store = peakRssMb();

      // What the plate-fits job does (lib/plates/recompute.ts, runPlateFitsJob), in this transaction.
      const [, fitMs] = await timed('fit', () => refitPlate(plateId, actor.id, transaction));
      ms.fit = fitMs;
      peakMb.fit = peakRssMb();

      const fits = await Fit.findAll({ attributes: ['status'], where: { plateId }, raw: true, transaction });
      counts = {
        wells: plate.wells.length,
        readouts: plate.wells.reduce((n, w) => n + w.readouts.length, 0),
        fits: fits.length,
        fitted: fits.filter((f) => f.status === 'fitted').length,
      };
      throw new Rollback();
    })
    .catch((error: unknown) => {
      if (!(error instanceof Rollback)) throw error;
    });
  return { ms, peakMb, ...counts };
}

function parseArgs(argv: readonly string[]): { repeats: number; kind: 'xlsx' | 'csv' } | null {
  let repeats = 3;
  let kind: 'xlsx' | 'csv' = 'xlsx';
  for (const arg of argv) {
    if (arg === '--csv') kind = 'csv';
    else if (arg === '--xlsx') kind = 'xlsx';
    else if (/^\d+$/.test(arg) && Number(arg) >= 1) repeats = Number(arg);
    else return null;
  }
  return { repeats, kind };
}

async function main(): Promise<number> {
  const args = parseArgs(process.argv.slice(2));
  if (!args) {
    process.stderr.write(
      'usage: node --conditions=react-server --import tsx scripts/bench-import.ts [repeats ≥ 1] [--xlsx|--csv]\n',
    );
    return 2;
  }
  const atStart = peakRssMb();
  const file = writeBenchExport(args.kind);
  const runs: Run[] = [];
  for (let i = 0; i < args.repeats; i += 1) runs.push(await once(file));
  const first = runs[0]!;
  const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
  const totals = runs.map((r) => STAGES.reduce((sum, s) => sum + r.ms[s], 0));

  console.log(
    `1536-well long-layout ${args.kind} (${(file.bytes.byteLength / 1024).toFixed(0)} KB, ${file.rows} rows, ` +
      `${BENCH_TARGETS.length} targets): ${first.wells} wells, ${first.readouts} readouts, ` +
      `${first.fits} fits (${first.fitted} fitted); ${args.repeats} run${args.repeats === 1 ? '' : 's'}, writes rolled back`,
  );
  const cpuTotals = runs.map((_, i) => STAGES.reduce((sum, s) => sum + cpuMs[s]![i]!, 0));
  const backendTotals = runs.map((_, i) => STAGES.reduce((sum, s) => sum + (backendMs[s]?.[i] ?? NaN), 0));
  const cell = (ms: number, width: number) => (Number.isFinite(ms) ? ms.toFixed(0) : '–').padStart(width);
  console.log(
    '  stage   wall ms: first run  median   CPU ms, median: this process  its PostgreSQL backend   peak RSS after it, MB',
  );
  for (const stage of STAGES)
    console.log(
      `  ${stage.padEnd(6)}  ${cell(first.ms[stage], 18)}  ${cell(median(runs.map((r) => r.ms[stage])), 6)}` +
        `  ${cell(median(cpuMs[stage]!), 29)}  ${cell(backendMs[stage] ? median(backendMs[stage]) : NaN, 23)}` +
        `  ${cell(first.peakMb[stage], 23)}`,
    );
  console.log(
    `  total   ${cell(totals[0]!, 18)}  ${cell(median(totals), 6)}  ${cell(median(cpuTotals), 29)}` +
      `  ${cell(median(backendTotals), 23)}   (target < 5000 ms wall)`,
  );
  // On a shared machine the wall times wait for CPU: the load average says how much (cores: os.availableParallelism()).
  console.log(
    `load average ${loadavg()
      .map((l) => l.toFixed(1))
      .join(' / ')} (1 / 5 / 15 min) on ${availableParallelism()} cores`,
  );
  console.log(
    `peak RSS of this process: ${peakRssMb().toFixed(0)} MB over all runs (${atStart.toFixed(0)} MB after loading, ` +
      'before the first run); target < 300 MB. Counted: main thread, parse worker thread, the fit; not PostgreSQL.',
  );
  return 0;
}

main()
  .then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      console.error(error);
      process.exitCode = 1;
    },
  )
  .finally(async () => {
    await closeJobQueue();
    await db().close();
  });
