// Gatewell fit benchmark: QC, fractional block and every Hill fit of one generated 384-well plate.
// `npx tsx scripts/bench-fit.ts [repeats]` prints figures; it checks nothing and times no test.
//
// Plate layout (16 × 24 = 384 wells, invented for the benchmark): 40 compounds × 8 concentrations
// (half-log 0.01–30 µM, one well each) = 320 wells, plus 32 vehicle and 32 reference-blocker wells.
// Each well is read for 2 targets (for example peak and late current of one voltage protocol),
// so a plate has 80 compound × target fits of 8 wells each.
import { computeFractionalBlock, type BlockWell } from '../lib/science/fit/block';
import { fitCompoundCurves, type CurvePoint } from '../lib/science/fit/compound-fits';
import { hillBlock, type HillModelName } from '../lib/science/fit/hill-model';
import { checkWells, type QcWell } from '../lib/science/qc/qc';

const SERIES_uM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];
const TARGETS = ['peak', 'late'];
const COMPOUNDS = 40;

/** Seeded uniform [0, 1) generator (mulberry32), so every run benchmarks the same plate. */
function uniform(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = Math.imul(state ^ (state >>> 15), state | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function generatePlate(): (QcWell & BlockWell & { compoundId: string | null; concentration_uM: number })[] {
  const random = uniform(384);
  const noise = () => (random() + random() + random() - 1.5) * 0.08;
  const wells: (QcWell & BlockWell & { compoundId: string | null; concentration_uM: number })[] = [];
  const truth = Array.from({ length: COMPOUNDS }, () =>
    TARGETS.map(() => ({ ic50_uM: 10 ** (-1.5 + random() * 3.5), slope: 0.7 + random() * 0.9 })),
  );
  for (let index = 0; index < 384; index++) {
    const wellId = `${String.fromCharCode(65 + Math.floor(index / 24))}${String((index % 24) + 1).padStart(2, '0')}`;
    const compound = index < COMPOUNDS * SERIES_uM.length ? Math.floor(index / SERIES_uM.length) : null;
    const role = compound !== null ? 'test' : index < 352 ? 'vehicle' : 'reference';
    const concentration_uM = compound !== null ? SERIES_uM[index % SERIES_uM.length]! : 0;
    TARGETS.forEach((target, t) => {
      const control = -(800 + random() * 1500);
      const trueBlock =
        role === 'vehicle'
          ? 0
          : role === 'reference'
            ? 0.97
            : hillBlock(concentration_uM, truth[compound!]![t]!.ic50_uM, truth[compound!]![t]!.slope);
      const ratio = 0.93 * (1 - trueBlock) + noise();
      wells.push({
        wellId,
        target,
        role,
        compoundId: compound === null ? null : `GW-${String(compound + 1).padStart(4, '0')}`,
        concentration_uM,
        controlCurrent_pA: control,
        compoundCurrent_pA: control * ratio,
        excluded: false,
        sealResistance_GOhm: 0.3 + random() * 3,
        seriesResistance_MOhm: 3 + random() * 20,
        capacitance_pF: 8 + random() * 30,
      });
    });
  }
  return wells;
}

/** One plate end to end: QC → block per target → fits per compound × target. */
function analyse(wells: ReturnType<typeof generatePlate>, model: HillModelName) {
  const qc = checkWells(wells);
  const blockWells = wells.map((w, i) => ({ ...w, excluded: !qc[i]!.passed }));
  const blocks = computeFractionalBlock(blockWells);
  const source = new Map(blockWells.map((w) => [`${w.target} ${w.wellId}`, w]));
  const points: CurvePoint[] = [];
  for (const target of blocks) {
    for (const w of target.wells) {
      if (w.role !== 'test') continue;
      const well = source.get(`${target.target} ${w.wellId}`)!;
      points.push({
        compoundId: well.compoundId!,
        target: target.target,
        concentration_uM: well.concentration_uM,
        block: w.block,
        excluded: w.excluded,
      });
    }
  }
  const started = performance.now();
  const fits = fitCompoundCurves(points, { model });
  return { fits, fitMs: performance.now() - started };
}

function main(): void {
  const repeats = Number(process.argv[2] ?? 50);
  const wells = generatePlate();
  console.log(
    `plate: 384 wells × ${TARGETS.length} targets, ${COMPOUNDS} compounds × ${SERIES_uM.length} concentrations; ${repeats} repeats after warm-up`,
  );
  for (const model of ['hill2', 'hill4'] as const) {
    for (let i = 0; i < 5; i++) analyse(wells, model);
    const fitTimes: number[] = [];
    const totalTimes: number[] = [];
    let fits: ReturnType<typeof analyse>['fits'] = [];
    for (let i = 0; i < repeats; i++) {
      const started = performance.now();
      const run = analyse(wells, model);
      totalTimes.push(performance.now() - started);
      fitTimes.push(run.fitMs);
      fits = run.fits;
    }
    const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
    const statuses = fits.reduce<Record<string, number>>(
      (acc, f) => ({ ...acc, [f.result.status]: (acc[f.result.status] ?? 0) + 1 }),
      {},
    );
    console.log(
      `${model}: ${fits.length} fits in ${median(fitTimes).toFixed(2)} ms (median; ${(fits.length / (median(fitTimes) / 1000)).toFixed(0)} fits/s), ` +
        `whole plate with QC and block ${median(totalTimes).toFixed(2)} ms (median), statuses ${JSON.stringify(statuses)}`,
    );
  }
}

main();
