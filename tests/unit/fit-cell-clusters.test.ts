import { describe, expect, test } from 'vitest';
import { cellClusterCovariance, pointsShareCells } from '@/lib/science/fit/cell-clusters';
import { fitHill } from '@/lib/science/fit/hill-fit';
import { makeRandom } from '@/scripts/demo-plates/random';
import { analysePlate, type AnalysisReadout, type AnalysisWell } from '@/lib/science/plate-analysis';
import type { CurveModel } from '@/lib/science/fit/least-squares-model';

// Cumulative application: each simulated cell receives the whole series in turn, so its points share the
// cell's run-down and the cell's own potency. The truth of every simulation is IC50 1 µM (log10 0), Hill
// slope 1, by construction (the numbers are invented, as in tests/fixtures/export-layouts/truth.ts).
const SERIES_UM = [0.01, 0.03, 0.1, 0.3, 1, 3, 10, 30];

interface Simulation {
  cells: number;
  /** σ of the cell's own log10 IC50 around the truth. */
  cellLog10Sd: number;
  /** σ of the cell's run-down factor (mean 1) on the current left unblocked. */
  rundownSd: number;
  /** σ of each application's own scatter (fraction). */
  noiseSd: number;
}

/** One simulated compound: `cells` cells × the series, seeded. */
function simulate(seed: number, s: Simulation) {
  const random = makeRandom(seed);
  const concentration_uM: number[] = [];
  const block: number[] = [];
  const cell: string[] = [];
  for (let g = 0; g < s.cells; g += 1) {
    const shift = random.normal(0, s.cellLog10Sd);
    const rundown = random.normal(1, s.rundownSd);
    for (const c of SERIES_UM) {
      const blocked = 1 / (1 + 10 ** (shift - Math.log10(c)));
      concentration_uM.push(c);
      block.push(1 - (1 - blocked) * rundown + random.normal(0, s.noiseSd));
      cell.push(`cell-${g}`);
    }
  }
  return { concentration_uM, block, cell };
}

/** Coverage of log10 IC50 = 0 and mean width (log10 units) of the naive and the cell-level 95 % CIs. */
function coverage(s: Simulation, replicates: number, firstSeed: number) {
  const tally = { naive: 0, cell: 0, naiveWidth: 0, cellWidth: 0, fitted: 0 };
  for (let i = 0; i < replicates; i += 1) {
    const data = simulate(firstSeed + i, s);
    const naive = fitHill({ concentration_uM: data.concentration_uM, block: data.block }).ic50Ci95_uM;
    const byCell = fitHill(data).ic50Ci95_uM;
    if (!naive || !byCell) continue;
    tally.fitted += 1;
    if (naive[0] <= 1 && naive[1] >= 1) tally.naive += 1;
    if (byCell[0] <= 1 && byCell[1] >= 1) tally.cell += 1;
    tally.naiveWidth += Math.log10(naive[1] / naive[0]);
    tally.cellWidth += Math.log10(byCell[1] / byCell[0]);
  }
  return {
    fitted: tally.fitted,
    naive: tally.naive / tally.fitted,
    cell: tally.cell / tally.fitted,
    naiveWidth: tally.naiveWidth / tally.fitted,
    cellWidth: tally.cellWidth / tally.fitted,
  };
}

const REPLICATES = 400;

describe('the CI of log IC50 with the cell as the unit (cumulative application)', () => {
  // With 400 replicates the binomial SD of a 95 % coverage is 1.1 %: 0.92–0.98 is about ±2.7 SD.
  test.each([
    // Cells differ in potency (σ 0.15 log10) and run-down (σ 3 %), scatter 3 %: six cells, as on the fixture plate.
    { cells: 6, cellLog10Sd: 0.15, rundownSd: 0.03, noiseSd: 0.03 },
    // Run-down shared by the cell only (the fixture truth's noise: σ 2.1 %, scatter 2.6 %).
    { cells: 6, cellLog10Sd: 0, rundownSd: 0.021, noiseSd: 0.026 },
    // Few cells: four.
    { cells: 4, cellLog10Sd: 0.15, rundownSd: 0.03, noiseSd: 0.03 },
  ])(
    '$cells cells, cell σ log10 IC50 $cellLog10Sd, run-down σ $rundownSd: wider than the naive CI, about nominal coverage',
    (s) => {
      const seen = coverage(s, REPLICATES, 18_000);
      expect(seen.fitted).toBeGreaterThanOrEqual(REPLICATES * 0.99);
      expect(seen.cellWidth).toBeGreaterThan(seen.naiveWidth);
      expect(seen.cell).toBeGreaterThanOrEqual(0.92);
      expect(seen.cell).toBeLessThanOrEqual(0.98);
    },
  );

  test('where cells differ in potency the naive CI misses the truth far more often than one time in twenty', () => {
    const seen = coverage(
      { cells: 6, cellLog10Sd: 0.15, rundownSd: 0.03, noiseSd: 0.03 },
      REPLICATES,
      18_000,
    );
    expect(seen.naive).toBeLessThan(0.8);
    expect(seen.cellWidth / seen.naiveWidth).toBeGreaterThan(2);
  });

  test('the same data give the same interval (deterministic), and the estimate is the pooled fit’s', () => {
    const data = simulate(7, { cells: 6, cellLog10Sd: 0.1, rundownSd: 0.03, noiseSd: 0.03 });
    const pooled = fitHill({ concentration_uM: data.concentration_uM, block: data.block });
    const byCell = fitHill(data);
    expect(fitHill(data)).toEqual(byCell);
    expect(byCell.ic50_uM).toBe(pooled.ic50_uM);
    expect(byCell.estimate!.intervalUnit).toBe('cell');
    expect(byCell.estimate!.cells).toBe(6);
    expect(byCell.estimate!.degreesOfFreedom).toBe(5);
    expect(pooled.estimate!.intervalUnit).toBe('point');
    expect(pooled.estimate!.degreesOfFreedom).toBe(48 - 2);
    expect(byCell.message).toMatch(
      /cells as the unit\), Hill slope [\d.]+, from 48 applications to 6 cells at 8/,
    );
  });

  test('one point per cell is the naive interval; one cell alone gives no interval', () => {
    const data = simulate(8, { cells: 6, cellLog10Sd: 0.1, rundownSd: 0.03, noiseSd: 0.03 });
    const ownCells = data.cell.map((_, i) => `well-${i}`);
    expect(pointsShareCells(ownCells)).toBe(false);
    expect(fitHill({ ...data, cell: ownCells })).toEqual(
      fitHill({ concentration_uM: data.concentration_uM, block: data.block }),
    );
    const oneCell = simulate(9, { cells: 1, cellLog10Sd: 0, rundownSd: 0.02, noiseSd: 0.03 });
    const alone = fitHill(oneCell);
    expect(alone.status).toBe('fitted');
    expect(alone.ic50Ci95_uM).toBeNull();
    expect(alone.flags.map((f) => f.code)).toContain('no_confidence_interval');
  });

  test('for a straight line with the same design in every cell, the covariance is the variance of the cells’ own estimates over G', () => {
    // Worked by hand: y = a + b·x on x = 0, 1, 2 in three cells; each cell's own line is exact, with
    // intercepts 0, 1, 2 and slopes 1, 1, 4: the pooled fit is their mean (a 1, b 2), and with
    // c = G/(G−1)·(n−1)/(n−p) = 3/2 · 8/7 the variance of b is c·Σ(b_g − b̄)²/G² = (12/7)·6/9 = 8/7.
    const line: CurveModel = {
      parameterCount: 2,
      evaluate(x, p, gradient) {
        if (gradient) {
          gradient[0] = 1;
          gradient[1] = x;
        }
        return p[0]! + p[1]! * x;
      },
    };
    const x = [0, 1, 2, 0, 1, 2, 0, 1, 2];
    const y = [0, 1, 2, 1, 2, 3, 2, 6, 10];
    const cells = ['a', 'a', 'a', 'b', 'b', 'b', 'c', 'c', 'c'];
    const v = cellClusterCovariance(line, x, y, [1, 2], cells)!;
    expect(v.cells).toBe(3);
    expect(v.degreesOfFreedom).toBe(2);
    expect(v.covariance[1]![1]).toBeCloseTo(8 / 7, 12);
    // Intercepts 0, 1, 2 about their mean 1: Σ = 2, so c·2/9 = (12/7)·(2/9) = 8/21.
    expect(v.covariance[0]![0]).toBeCloseTo(8 / 21, 12);
  });

  test('analysePlate gives the cells of a cumulative plate to the fit, and single-application wells not', () => {
    const wells: AnalysisWell[] = [];
    const readouts: AnalysisReadout[] = [];
    const well = (id: string, role: AnalysisWell['role'], compoundId: string | null, c: number | null) =>
      wells.push({
        id,
        role,
        compoundId,
        excluded: false,
        concentration_uM: c,
        sealResistance_GOhm: 1.5,
        seriesResistance_MOhm: 5,
        capacitance_pF: 18,
      });
    for (let v = 0; v < 4; v += 1) {
      well(`veh-${v}`, 'vehicle', null, null);
      readouts.push({
        id: `veh-${v}`,
        wellId: `veh-${v}`,
        target: 'Nav1.7',
        controlCurrent_pA: -2000,
        compoundCurrent_pA: -1990 + 10 * v,
      });
    }
    for (let r = 0; r < 4; r += 1) {
      well(`ref-${r}`, 'reference', null, 1);
      readouts.push({
        id: `ref-${r}`,
        wellId: `ref-${r}`,
        target: 'Nav1.7',
        controlCurrent_pA: -2000,
        compoundCurrent_pA: -40 - 5 * r,
      });
    }
    const data = simulate(11, { cells: 5, cellLog10Sd: 0.1, rundownSd: 0.03, noiseSd: 0.03 });
    data.block.forEach((b, i) => {
      const cellId = data.cell[i]!;
      if (!wells.some((w) => w.id === cellId)) well(cellId, 'test', 'CUM', null);
      readouts.push({
        id: `r-${i}`,
        wellId: cellId,
        target: 'Nav1.7',
        controlCurrent_pA: -2000,
        compoundCurrent_pA: -2000 * (1 - b),
        concentration_uM: data.concentration_uM[i]!,
      });
      well(`single-${i}`, 'test', 'ONE', data.concentration_uM[i]!);
      readouts.push({
        id: `s-${i}`,
        wellId: `single-${i}`,
        target: 'Nav1.7',
        controlCurrent_pA: -2000,
        compoundCurrent_pA: -2000 * (1 - b),
      });
    });
    const fits = analysePlate(wells, readouts).fits;
    const cumulative = fits.find((f) => f.compoundId === 'CUM')!.result;
    const single = fits.find((f) => f.compoundId === 'ONE')!.result;
    expect(cumulative.estimate!.intervalUnit).toBe('cell');
    expect(cumulative.estimate!.cells).toBe(5);
    expect(single.estimate!.intervalUnit).toBe('point');
    // The same numbers: the same estimate; the cell-level interval is the wider.
    expect(cumulative.ic50_uM).toBeCloseTo(single.ic50_uM!, 10);
    const width = (ci: [number, number] | null) => Math.log10(ci![1] / ci![0]);
    expect(width(cumulative.ic50Ci95_uM)).toBeGreaterThan(width(single.ic50Ci95_uM));
  });
});
