// The firing transition: where a compound stops the cell firing repetitively, its band against a
// bisection per draw, and the "near a firing transition" mark.
import { describe, expect, test } from 'vitest';
import { measureSample, quantileSorted } from '@/lib/science/forecast/band-cell';
import { planBands } from '@/lib/science/forecast/bands';
import { computeForecast } from '@/lib/science/forecast/forecast';
import {
  TRANSITION_REL_TOLERANCE,
  findFiringTransition,
  nearFiringTransition,
  transitionConcentration,
} from '@/lib/science/forecast/firing-transition';
import { conditionTasks, controlTask, planForecast } from '@/lib/science/forecast/plan';
import { parseForecastRequest } from '@/lib/science/forecast/request-schema';
import { runMeasureTask } from '@/lib/science/forecast/tasks';
import { poreBlockFraction } from '@/lib/science/forecast/pore-block';

const PRESET = 'pospischil-rs-2008';
/** Invented covariance of (log10 IC50, Hill slope), wide enough to spread the transition by tens of per cent. */
const COVARIANCE = [
  [0.0025, 0.0005],
  [0.0005, 0.01],
];
const DRAWS = 30;

function transitionTaskOf(
  potencies: Record<string, { ic50: number; hill: number }>,
  concentrations: number[],
) {
  const plan = planForecast(
    parseForecastRequest({
      preset: PRESET,
      potencies,
      concentrations,
      trace: false,
      uncertainty: {
        seed: 4,
        draws: DRAWS,
        potencies: Object.fromEntries(Object.keys(potencies).map((k) => [k, { covariance: COVARIANCE }])),
      },
    }),
  );
  const control = runMeasureTask(controlTask(plan));
  const measured = conditionTasks(plan, control).map(runMeasureTask);
  return planBands(plan, control)!.transitionTask(control, measured);
}

/** The transition of every draw by its own bisection, sorted. */
function perDraw(task: ReturnType<typeof transitionTaskOf>): number[] {
  const draws = task.draws!;
  return Array.from({ length: DRAWS }, (_, i) => {
    const potencies = Object.fromEntries(
      Object.entries(draws).map(([name, d]) => [name, { ic50: 10 ** d.log10Ic50[i]!, hill: d.hill[i]! }]),
    );
    return transitionConcentration(task, potencies, { firing: 0.1, silent: null }, 1e4)!;
  }).sort((a, b) => a - b);
}

const rate = (task: ReturnType<typeof transitionTaskOf>, c: number) =>
  measureSample(
    task.preset,
    Object.fromEntries(
      Object.entries(task.potencies).map(([n, p]) => [n, 1 - poreBlockFraction(c, p.ic50, p.hill)]),
    ),
    task.request,
    true,
  ).rate_Hz!;

describe('firing transition', () => {
  test('one conductance: silent at the transition, firing just below it; band equals a bisection per draw', () => {
    const task = transitionTaskOf({ gNa: { ic50: 1, hill: 1 } }, [1, 3, 30]);
    const t = findFiringTransition(task);
    expect(t.status).toBe('found');
    const c = t.concentration!;
    expect(rate(task, c)).toBe(0);
    expect(rate(task, c / (1 + 2 * TRANSITION_REL_TOLERANCE))).toBeGreaterThan(0);
    expect(t.block!.gNa).toBeCloseTo(poreBlockFraction(c, 1, 1), 12);
    const brute = perDraw(task);
    // The closed form uses the estimate's transition block for every draw; each draw's own bisection is
    // within its tolerance of it, so the quantiles agree within twice that tolerance.
    for (const [got, p] of [
      [t.band!.low, 0.025],
      [t.band!.median, 0.5],
      [t.band!.high, 0.975],
    ] as const) {
      const want = quantileSorted(brute, p)!;
      expect(Math.abs(got / want - 1)).toBeLessThanOrEqual(2 * TRANSITION_REL_TOLERANCE);
    }
  }, 120_000);

  test('two conductances: the band lies within a neighbouring order statistic of a bisection per draw', () => {
    const task = transitionTaskOf({ gNa: { ic50: 1, hill: 1 }, gM: { ic50: 3, hill: 1.2 } }, [1, 3, 30]);
    const t = findFiringTransition(task);
    expect(t.status).toBe('found');
    const brute = perDraw(task);
    for (const [got, p] of [
      [t.band!.low, 0.025],
      [t.band!.median, 0.5],
      [t.band!.high, 0.975],
    ] as const) {
      const h = (DRAWS - 1) * p;
      const below = brute[Math.max(0, Math.floor(h) - 1)]!;
      const above = brute[Math.min(DRAWS - 1, Math.ceil(h) + 1)]!;
      expect(got).toBeGreaterThanOrEqual(below * (1 - 2 * TRANSITION_REL_TOLERANCE));
      expect(got).toBeLessThanOrEqual(above * (1 + 2 * TRANSITION_REL_TOLERANCE));
    }
  }, 120_000);

  test('a cell that never fires repetitively at the drive has no transition to lose', () => {
    const t = findFiringTransition({
      ...transitionTaskOf({ gNa: { ic50: 1, hill: 1 } }, [1]),
      measured: [{ concentration: 0, rate_Hz: 0 }],
    });
    expect(t.status).toBe('silent-at-control');
    expect(t.concentration).toBeNull();
  });

  test('the mark: inside the transition band, or a rate band whose low end is under half its high end', () => {
    const t = {
      status: 'found' as const,
      concentration: 8,
      block: { gNa: 0.89 },
      band: { low: 6, median: 8, high: 10 },
      note: '',
    };
    expect(nearFiringTransition(7, t, { low: 30, high: 35 })).toBe(true);
    expect(nearFiringTransition(3, t, { low: 30, high: 35 })).toBe(false);
    expect(nearFiringTransition(3, t, { low: 0, high: 35 })).toBe(true);
    expect(nearFiringTransition(3, t, { low: 17, high: 35 })).toBe(true);
    expect(nearFiringTransition(3, t, { low: 18, high: 35 })).toBe(false);
    expect(nearFiringTransition(3, null, { low: 0, high: 0 })).toBe(false);
  });

  test('a forecast marks the concentration within the transition band and not one far below it', () => {
    const r = computeForecast({
      preset: PRESET,
      potencies: { gNa: { ic50: 1, hill: 1 } },
      concentrations: [0.3, 8],
      trace: false,
      uncertainty: { seed: 2, draws: 200, potencies: { gNa: { covariance: COVARIANCE } } },
    });
    const t = r.bands!.transition!;
    expect(t.band!.low).toBeLessThanOrEqual(8);
    expect(t.band!.high).toBeGreaterThanOrEqual(8);
    expect(r.bands!.conditions.map((c) => c!.nearTransition)).toEqual([false, true]);
  }, 120_000);
});
