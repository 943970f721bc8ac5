// Hill fit of one compound × target: which wells count, which status, what the user is told.
import { fitHillCurve, type HillCurveEstimate } from './hill-curve';
import type { HillModelName } from './hill-model';
import { resolveHillFitOptions, type HillFitOptions } from './hill-options';
import { concentrationLevels } from './hill-start';

export type HillFitStatus = 'fitted' | 'above_range' | 'inactive' | 'insufficient' | 'not_converged';

export type HillFitFlagCode = 'hill_slope_outside_band' | 'ic50_below_range' | 'no_confidence_interval';

export interface HillFitFlag {
  code: HillFitFlagCode;
  message: string;
}

export interface HillFitInput {
  /** Concentration per well (µM); 0 is a vehicle point, which anchors `bottom` but is not a tested concentration. */
  concentration_uM: ArrayLike<number>;
  /** Fractional block per well (0 none, 1 full). */
  block: ArrayLike<number>;
  /** true for wells left out (QC flag or exclusion); their values are not read. @default none */
  excluded?: ArrayLike<boolean>;
  /**
   * The cell each point was recorded in. Points sharing a cell are applications of one cell in turn
   * (cumulative): the CI then takes the cell as the unit (`cell-clusters.ts`). @default every point its own
   */
  cell?: ArrayLike<string>;
}

export interface HillFitResult {
  model: HillModelName;
  status: HillFitStatus;
  /** One sentence for the user: the result, or why there is none. */
  message: string;
  /** Only for status 'fitted'; null otherwise. */
  ic50_uM: number | null;
  ic50Ci95_uM: [number, number] | null;
  log10Ic50Se: number | null;
  /** For 'above_range' and 'inactive': IC50 is above this, the highest concentration tested (µM). */
  ic50LowerBound_uM: number | null;
  hillSlope: number | null;
  /** Fixed 0 and 1 for hill2 once fitted; null when there is no fit. */
  bottom: number | null;
  top: number | null;
  r2: number | null;
  residualSd: number | null;
  /** Wells used (replicates each count). */
  n: number;
  /** Distinct tested concentrations (> 0) among the wells used. */
  concentrations: number;
  flags: HillFitFlag[];
  /** The least-squares estimate behind a 'fitted' result, or an 'above_range' one decided from the fitted curve; for plots and review. */
  estimate: HillCurveEstimate | null;
}

/** Fits block(C) = bottom + (top − bottom)/(1 + (IC50/C)^n) to one compound × target and classifies the outcome. */
export function fitHill(input: HillFitInput, options?: HillFitOptions): HillFitResult {
  const o = resolveHillFitOptions(options);
  const { concentration_uM, block, cell } = usedPoints(input);
  const levels = concentrationLevels(concentration_uM, block);
  const base = { model: o.model, n: block.length, concentrations: levels.length };
  const none = (
    status: HillFitStatus,
    message: string,
    extra: Partial<HillFitResult> = {},
  ): HillFitResult => ({
    ...base,
    status,
    message,
    ic50_uM: null,
    ic50Ci95_uM: null,
    log10Ic50Se: null,
    ic50LowerBound_uM: null,
    hillSlope: null,
    bottom: null,
    top: null,
    r2: null,
    residualSd: null,
    flags: [],
    estimate: null,
    ...extra,
  });
  if (levels.length < o.minConcentrations) {
    return none(
      'insufficient',
      `${levels.length} distinct concentration${levels.length === 1 ? '' : 's'} in use; a ${o.model} fit needs at least ${o.minConcentrations}.`,
    );
  }
  const highest = levels[levels.length - 1]!;
  const strongest = levels.reduce((a, b) => (b.meanBlock > a.meanBlock ? b : a));
  if (strongest.meanBlock < o.inactiveBlock) {
    return none(
      'inactive',
      `No meaningful block: at most ${percent(strongest.meanBlock)} (at ${uM(strongest.concentration_uM)}), below the ${percent(o.inactiveBlock)} threshold.`,
      { ic50LowerBound_uM: highest.concentration_uM },
    );
  }
  const aboveRange = (why: string, estimate: HillCurveEstimate | null) =>
    none(
      'above_range',
      `IC50 above the highest concentration tested (> ${uM(highest.concentration_uM)}): ${why}.`,
      { ic50LowerBound_uM: highest.concentration_uM, estimate },
    );
  if (highest.meanBlock < o.aboveRangeBlock) {
    return aboveRange(`block at ${uM(highest.concentration_uM)} is ${percent(highest.meanBlock)}`, null);
  }
  const fit = fitHillCurve(concentration_uM, block, o, cell);
  if (!fit.converged) {
    return none(
      'not_converged',
      `The fit did not converge (${STOP_WORDS[fit.stop] ?? fit.stop} after ${fit.iterations} iteration${fit.iterations === 1 ? '' : 's'}); no IC50 is reported.`,
    );
  }
  if (fit.ic50AtSearchEdge) {
    return none(
      'not_converged',
      `The fit ran to the edge of the IC50 search range (${uM(fit.ic50_uM)}); the data do not place an IC50.`,
    );
  }
  if (fit.ic50_uM > highest.concentration_uM) return aboveRange(`the fitted IC50 is ${uM(fit.ic50_uM)}`, fit);
  const flags = fitFlags(fit, levels[0]!.concentration_uM, o.hillSlopeBand);
  return {
    ...base,
    status: 'fitted',
    message: `IC50 ${uM(fit.ic50_uM)}${fit.ic50Ci95_uM ? ` (95 % CI ${uM(fit.ic50Ci95_uM[0])} to ${uM(fit.ic50Ci95_uM[1])}${fit.intervalUnit === 'cell' ? `, cells as the unit` : ''})` : ''}, Hill slope ${round(fit.hillSlope)}, from ${fit.intervalUnit === 'cell' ? `${base.n} applications to ${fit.cells ?? cellCount(cell)} cells` : `${base.n} wells`} at ${base.concentrations} concentrations.`,
    ic50_uM: fit.ic50_uM,
    ic50Ci95_uM: fit.ic50Ci95_uM,
    log10Ic50Se: fit.log10Ic50Se,
    ic50LowerBound_uM: null,
    hillSlope: fit.hillSlope,
    bottom: fit.bottom,
    top: fit.top,
    r2: fit.r2,
    residualSd: fit.residualSd,
    flags,
    estimate: fit,
  };
}

function fitFlags(fit: HillCurveEstimate, lowest_uM: number, band: readonly [number, number]): HillFitFlag[] {
  const flags: HillFitFlag[] = [];
  if (fit.hillSlope < band[0] || fit.hillSlope > band[1]) {
    flags.push({
      code: 'hill_slope_outside_band',
      message: `Hill slope ${round(fit.hillSlope)} is outside the plausible band ${band[0]}–${band[1]}${fit.hillSlopeAtBound ? ' (at the limit of its search range)' : ''}.`,
    });
  }
  if (fit.ic50_uM < lowest_uM) {
    flags.push({
      code: 'ic50_below_range',
      message: `IC50 ${uM(fit.ic50_uM)} is below the lowest concentration tested (${uM(lowest_uM)}): an extrapolation.`,
    });
  }
  if (fit.ic50Ci95_uM === null) {
    flags.push({
      code: 'no_confidence_interval',
      message:
        fit.intervalUnit === 'cell'
          ? 'No confidence interval on IC50: the applications come from fewer than two cells, or the data do not determine the parameters separately.'
          : 'No confidence interval on IC50: too few wells for the free parameters, or the data do not determine them separately.',
    });
  }
  return flags;
}

/** The wells not excluded, checked: concentration finite and ≥ 0, block finite; throws RangeError naming the well index. */
function usedPoints(input: HillFitInput): {
  concentration_uM: Float64Array;
  block: Float64Array;
  cell: string[] | undefined;
} {
  const { concentration_uM: c, block: b, excluded, cell } = input;
  if (c.length !== b.length)
    throw new RangeError(`concentration_uM has ${c.length} values but block has ${b.length}`);
  if (excluded && excluded.length !== c.length)
    throw new RangeError(`excluded has ${excluded.length} values but there are ${c.length} wells`);
  if (cell && cell.length !== c.length)
    throw new RangeError(`cell has ${cell.length} values but there are ${c.length} wells`);
  const keep: number[] = [];
  for (let i = 0; i < c.length; i++) {
    if (excluded?.[i]) continue;
    if (!Number.isFinite(c[i]) || c[i]! < 0)
      throw new RangeError(`well ${i}: concentration_uM must be a finite number ≥ 0, got ${c[i]}`);
    if (!Number.isFinite(b[i])) throw new RangeError(`well ${i}: block must be a finite number, got ${b[i]}`);
    keep.push(i);
  }
  return {
    concentration_uM: Float64Array.from(keep, (i) => c[i]!),
    block: Float64Array.from(keep, (i) => b[i]!),
    cell: cell ? keep.map((i) => cell[i]!) : undefined,
  };
}

const cellCount = (cell: readonly string[] | undefined): number => new Set(cell).size;

const STOP_WORDS: Partial<Record<HillCurveEstimate['stop'], string>> = {
  max_iterations: 'iteration limit reached',
  non_finite: 'the model gave a non-finite value',
  stalled: 'no step reduced the residuals',
};
const round = (value: number): string => String(Number(value.toPrecision(3)));
const uM = (value: number): string => `${round(value)} µM`;
const percent = (fraction: number): string => `${Math.round(fraction * 100)} %`;
