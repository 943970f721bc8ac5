// The bands' shortcut (few model runs per concentration, band-cell.ts) against a model run for every draw.
import { describe, expect, test } from 'vitest';
import {
  bandCell,
  bandOfSamples,
  perDrawSamples,
  type Band,
  type BandMeasure,
} from '@/lib/science/forecast/band-cell';
import { planBands } from '@/lib/science/forecast/bands';
import { conditionTasks, controlTask, planForecast } from '@/lib/science/forecast/plan';
import { parseForecastRequest } from '@/lib/science/forecast/request-schema';
import { runMeasureTask } from '@/lib/science/forecast/tasks';

/**
 * How far the shortcut may sit from the per-draw band: within the per-draw quantile's two neighbouring
 * order statistics (the shortcut runs the model between two adjacent draws, and a rate that jumps to 0
 * between them may take either side), widened by the rheobase bisection's tolerance (0.1 %, with room for
 * its different start: 0.5 %), 0.2 mV or 0.5 Hz. Our choice, no source.
 */
const SLACK: Record<BandMeasure, (v: number) => number> = {
  rheobase_uA_cm2: (v) => 0.005 * Math.abs(v),
  threshold_mV: () => 0.2,
  rate_Hz: () => 0.5,
};

/** A covariance of (log10 IC50, Hill slope) wide enough to spread the blocks by a few per cent (invented). */
const COVARIANCE = [
  [0.0025, 0.0005],
  [0.0005, 0.01],
];
const DRAWS = 40;

function cellOf(
  preset: string,
  potencies: Record<string, { ic50: number; hill: number }>,
  concentration: number,
  seed: number,
) {
  const plan = planForecast(
    parseForecastRequest({
      preset,
      potencies,
      concentrations: [concentration],
      trace: false,
      uncertainty: {
        seed,
        draws: DRAWS,
        potencies: Object.fromEntries(Object.keys(potencies).map((k) => [k, { covariance: COVARIANCE }])),
      },
    }),
  );
  const control = runMeasureTask(controlTask(plan));
  const measured = runMeasureTask(conditionTasks(plan, control)[0]!);
  return planBands(plan, control)!.task(0, measured);
}

function expectWithin(measure: BandMeasure, shortcut: Band, perDraw: Band, values: (number | null)[]) {
  expect(shortcut.missing).toBe(perDraw.missing);
  const kept = values
    .map((v) => (v === null ? (measure === 'rheobase_uA_cm2' ? Infinity : null) : v))
    .filter((v): v is number => v !== null)
    .sort((a, b) => a - b);
  const pairs: [number, number | null][] = [
    [0.025, shortcut.low],
    [0.5, shortcut.median],
    [0.975, shortcut.high],
  ];
  for (const [p, got] of pairs) {
    const h = (kept.length - 1) * p;
    const below = kept[Math.max(0, Math.floor(h) - 1)]!;
    const above = kept[Math.min(kept.length - 1, Math.ceil(h) + 1)]!;
    if (!Number.isFinite(above) && !Number.isFinite(below)) {
      expect(got).toBeNull();
      continue;
    }
    expect(got).not.toBeNull();
    expect(got!).toBeGreaterThanOrEqual(below - SLACK[measure](below));
    if (Number.isFinite(above)) expect(got!).toBeLessThanOrEqual(above + SLACK[measure](above));
  }
}

// Cases: one and two drawn conductances, away from and near the regular-spiking cell's loss of
// repetitive firing (about 88–90 % sodium block at twice its control rheobase; found by scanning the
// block, Gatewell's model, so only where to look and not what to expect).
const CASES: {
  name: string;
  preset: string;
  potencies: Record<string, { ic50: number; hill: number }>;
  c: number;
}[] = [
  {
    name: 'one conductance, mid block',
    preset: 'pospischil-rs-2008',
    potencies: { gNa: { ic50: 1, hill: 1 } },
    c: 1,
  },
  {
    name: 'one conductance, near the firing transition',
    preset: 'pospischil-rs-2008',
    potencies: { gNa: { ic50: 1, hill: 1 } },
    c: 8,
  },
  {
    name: 'two conductances, mid block',
    preset: 'pospischil-rs-2008',
    potencies: { gNa: { ic50: 1, hill: 1 }, gM: { ic50: 3, hill: 1.2 } },
    c: 1.5,
  },
  {
    name: 'two conductances, near the firing transition',
    preset: 'pospischil-rs-2008',
    potencies: { gNa: { ic50: 1, hill: 1 }, gM: { ic50: 3, hill: 1.2 } },
    c: 8,
  },
  {
    name: 'two conductances, Hodgkin–Huxley',
    preset: 'hh-squid-1952',
    potencies: { gNa: { ic50: 1, hill: 1 }, gK: { ic50: 10, hill: 1.2 } },
    c: 2,
  },
];

describe('band shortcut against a model run per draw', () => {
  test.each(CASES)(
    '$name',
    ({ preset, potencies, c }) => {
      const task = cellOf(preset, potencies, c, 3);
      const fast = bandCell(task);
      const samples = perDrawSamples(task);
      console.log(
        preset,
        c,
        fast.ways,
        `${fast.runs} runs`,
        JSON.stringify({ fast: fast.rate_Hz, slow: bandOfSamples(samples, 'rate_Hz') }),
      );
      for (const m of ['rheobase_uA_cm2', 'threshold_mV', 'rate_Hz'] as const)
        expectWithin(
          m,
          fast[m],
          bandOfSamples(samples, m),
          samples.map((s) => s[m]),
        );
    },
    120_000,
  );
});

// The rate at a firing transition ('ordered', band-cell.ts rateByDominance) runs the same model at the
// draws' own blocks, so where the rate is monotone in each block it must give the per-draw band exactly;
// the reference is Gatewell's own model run at every draw, which is right here since the test is about the
// shortcut being exact, not about the model.
describe('the rate at a firing transition from ordered runs', () => {
  test.each([
    { seed: 3, c: 8 },
    { seed: 5, c: 7 },
    { seed: 9, c: 9 },
  ])(
    'two conductances, seed $seed at $c: the per-draw band exactly',
    ({ seed, c }) => {
      const task = cellOf(
        'pospischil-rs-2008',
        { gNa: { ic50: 1, hill: 1 }, gM: { ic50: 3, hill: 1.2 } },
        c,
        seed,
      );
      const fast = bandCell(task);
      const slow = bandOfSamples(perDrawSamples(task), 'rate_Hz');
      expect(fast.ways.rate_Hz).toBe('ordered');
      // Some draws fire and some do not, so this is a transition.
      expect(slow.low).toBe(0);
      expect(slow.high).toBeGreaterThan(0);
      for (const q of ['low', 'median', 'high'] as const) expect(fast.rate_Hz[q]).toBeCloseTo(slow[q]!, 9);
    },
    120_000,
  );
});

// Near the regular-spiking cell's firing transition the threshold is not monotone in the block, so it is
// found per draw; there most draws take their rheobase from a prediction checked every few draws
// (band-cell.ts, predictedThreshold) rather than from a search. Its band must still lie where the
// per-draw search puts it, within the same slack (0.2 mV).
describe('the threshold per draw with predicted rheobases', () => {
  test.each([
    { seed: 1, c: 9 },
    { seed: 4, c: 10 },
  ])(
    'two conductances, seed $seed at $c: within the per-draw band’s slack',
    ({ seed, c }) => {
      const task = cellOf(
        'pospischil-rs-2008',
        { gNa: { ic50: 1, hill: 1 }, gM: { ic50: 10, hill: 1.2 } },
        c,
        seed,
      );
      const fast = bandCell(task);
      const samples = perDrawSamples(task);
      expect(fast.ways.threshold_mV).toBe('per-draw');
      expectWithin(
        'threshold_mV',
        fast.threshold_mV,
        bandOfSamples(samples, 'threshold_mV'),
        samples.map((s) => s.threshold_mV),
      );
    },
    120_000,
  );
});
