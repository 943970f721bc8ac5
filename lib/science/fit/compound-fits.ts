// Hill fits of a plate: one per compound × target, in order of first appearance.
import { fitHill, type HillFitResult } from './hill-fit';
import type { HillFitOptions } from './hill-options';

export interface CurvePoint {
  compoundId: string;
  target: string;
  /** Nominal concentration in the well (µM). */
  concentration_uM: number;
  /** Fractional block; null (no value) counts as excluded. */
  block: number | null;
  /** Left out of the fit (QC flag or exclusion). */
  excluded: boolean;
}

export interface CompoundTargetFit {
  compoundId: string;
  target: string;
  result: HillFitResult;
}

/** Groups compound-well points by compound × target and fits each group with the same options. */
export function fitCompoundCurves(
  points: readonly CurvePoint[],
  options?: HillFitOptions,
): CompoundTargetFit[] {
  const groups = new Map<string, { compoundId: string; target: string; members: CurvePoint[] }>();
  for (const point of points) {
    const key = JSON.stringify([point.compoundId, point.target]);
    const group = groups.get(key);
    if (group) group.members.push(point);
    else groups.set(key, { compoundId: point.compoundId, target: point.target, members: [point] });
  }
  return [...groups.values()].map(({ compoundId, target, members }) => ({
    compoundId,
    target,
    result: fitHill(
      {
        concentration_uM: members.map((m) => m.concentration_uM),
        block: members.map((m) => m.block ?? Number.NaN),
        excluded: members.map((m) => m.excluded || m.block === null),
      },
      options,
    ),
  }));
}
