// Gatewell import benchmark: one 384-well export through parse → validate → analyse → store, ms per stage.
// Target: under 2 s in all. Prints figures; checks nothing. Every write is rolled back, so it can run on
// the demo database:
//   DATABASE_URL=$(bash scripts/pg.sh url dev) SESSION_SECRET=… \
//     node --conditions=react-server --import tsx scripts/bench-import.ts [repeats]
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { loadActor } from '@/lib/auth/load-actor';
import { db } from '@/lib/db';
import { guessMapping } from '@/lib/imports/guess-mapping';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import { validatePlateSheet } from '@/lib/imports/validate-plate-sheet';
import { parsedPlateInput } from '@/lib/plates/analysis-input';
import { analysisSettings } from '@/lib/plates/settings';
import { storePlate } from '@/lib/plates/store';
import { analysePlate } from '@/lib/science/plate-analysis';
import { Compound, Screen, Target, UserRole } from '@/models';
import { closeJobQueue } from '@/lib/jobs/queue';

const FILE = path.join(process.cwd(), 'seeders', 'data', 'demo-plates', 'nav-384-plate-02.xlsx');
const repeats = Number(process.argv[2] ?? 5);

class Rollback extends Error {}

const time = async <T>(work: () => Promise<T> | T): Promise<[T, number]> => {
  const start = performance.now();
  const result = await work();
  return [result, performance.now() - start];
};

async function once(bytes: Uint8Array) {
  const sequelize = db();
  const [parsed, parseMs] = await time(() => parseSpreadsheet(bytes, 'bench.xlsx'));
  if (!parsed.ok) throw new Error(parsed.error.message);
  const sheet = parsed.sheets.find((s) => s.name === 'Readouts') ?? parsed.sheets[0]!;
  const screen = await Screen.findOne({
    where: { name: 'Pain sodium screen' },
    include: [{ model: Target, as: 'targets' }],
    rejectOnEmpty: true,
  });
  const compounds = await Compound.findAll({ attributes: ['identifier'], raw: true });
  const [preview, validateMs] = await time(() =>
    validatePlateSheet(sheet, guessMapping(sheet).mapping, {
      knownCompounds: compounds.map((c) => c.identifier),
      knownTargets: (screen.get('targets') as Target[]).map((t) => t.name),
    }),
  );
  if (!preview.ok || !preview.plate)
    throw new Error(`the demo export did not validate: ${preview.issues[0]?.message}`);
  const plate = preview.plate;
  const [, analyseMs] = await time(() => {
    // As a preview analyses it (lib/plates/import-service.ts), fits included.
    const { wells, readouts } = parsedPlateInput(plate);
    return analysePlate(wells, readouts, analysisSettings(screen));
  });
  const biologist = await UserRole.findOne({
    attributes: ['userId'],
    where: { role: 'biologist' },
    raw: true,
  });
  const actor = biologist && (await loadActor(biologist.userId, '127.0.0.1'));
  if (!actor) throw new Error('no biologist in this database: seed it first');
  let storeMs = 0;
  await sequelize
    .transaction(async (transaction) => {
      // Store repeats the analysis inside (QC and block; the fits are a queued job) and writes every row, as a real import does.
      const unique = new Uint8Array([...bytes, ...new TextEncoder().encode(String(Math.random()))]);
      [, storeMs] = await time(() =>
        storePlate(
          actor,
          {
            screenId: screen.id,
            label: 'bench',
            plate,
            file: { bytes: unique, filename: 'bench.xlsx', mediaType: 'application/octet-stream' },
          },
          transaction,
        ),
      );
      throw new Rollback();
    })
    .catch((error: unknown) => {
      if (!(error instanceof Rollback)) throw error;
    });
  return { wells: plate.wells.length, parseMs, validateMs, analyseMs, storeMs };
}

async function main() {
  const bytes = new Uint8Array(readFileSync(FILE));
  const runs: Awaited<ReturnType<typeof once>>[] = [];
  for (let i = 0; i < repeats; i += 1) runs.push(await once(bytes));
  const median = (key: 'parseMs' | 'validateMs' | 'analyseMs' | 'storeMs') =>
    [...runs.map((r) => r[key])].sort((a, b) => a - b)[Math.floor(runs.length / 2)]!;
  const stages = {
    parse: median('parseMs'),
    validate: median('validateMs'),
    analyse: median('analyseMs'),
    store: median('storeMs'),
  };
  const total = stages.parse + stages.validate + stages.store;
  console.log(`384-well export (${runs[0]!.wells} wells), median of ${repeats} runs, ms:`);
  for (const [stage, ms] of Object.entries(stages)) console.log(`  ${stage.padEnd(9)} ${ms.toFixed(1)}`);
  console.log(
    `  total     ${total.toFixed(1)}  (parse + validate + store; store includes QC and block and queues the fit job)  target < 2000`,
  );
  await closeJobQueue();
  await db().close();
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
