import type { FitAnalysis } from '@/lib/science/plate-analysis';

/** The columns of a fits row for one analysed compound × target (ids resolved by the caller). */
export function fitRow(
  fit: FitAnalysis,
  ids: { plateId: string; compoundId: string; targetId: string; computedBy: string | null },
) {
  const r = fit.result;
  return {
    plateId: ids.plateId,
    compoundId: ids.compoundId,
    targetId: ids.targetId,
    readout: fit.readout,
    model: fit.model,
    status: r.status,
    message: r.message,
    ic50_uM: r.ic50_uM,
    ic50CiLow_uM: r.ic50Ci95_uM?.[0] ?? null,
    ic50CiHigh_uM: r.ic50Ci95_uM?.[1] ?? null,
    ic50LowerBound_uM: r.ic50LowerBound_uM,
    log10Ic50Se: r.log10Ic50Se,
    hill: r.hillSlope,
    top: r.top,
    bottom: r.bottom,
    r2: r.r2,
    residualSd: r.residualSd,
    n: r.n,
    flags: r.flags,
    estimate: r.estimate ? { ...r.estimate } : null,
    computedBy: ids.computedBy,
    computedAt: new Date(),
  };
}
