import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import type { CurveBasis } from '@/lib/science/fit/hill-band';
import type { FitView } from '@/lib/validation/plates';
import { listPlateFits, type FitRow } from './detail';
import { selectFitEstimatesWithRanges } from './queries';

/**
 * The plate's fits with what their curve and 95 % band are drawn from (estimates, covariance, degrees of
 * freedom and the tested range): the browser draws them with `fitCurve` (lib/science/fit/hill-band.ts),
 * so the answer carries a handful of numbers per fit instead of 121 points of curve and band.
 */
export async function listFitViews(actor: Actor, plateId: string): Promise<FitView[]> {
  const fits = await listPlateFits(actor, plateId);
  const rows = await selectFitEstimatesWithRanges(plateId);
  const byId = new Map(rows.map((r) => [r.id, r]));
  return fits.map((fit: FitRow) => {
    const extra = byId.get(fit.id);
    const estimate = extra?.estimate;
    const drawable =
      estimate?.parameters &&
      (fit.status === 'fitted' || fit.status === 'above_range') &&
      extra?.lowest &&
      extra.highest;
    const curveBasis: CurveBasis | null = drawable
      ? {
          parameters: estimate.parameters!,
          covariance: estimate.covariance ?? null,
          degreesOfFreedom: estimate.degreesOfFreedom ?? 0,
          lowest_uM: extra.lowest!,
          highest_uM: extra.highest!,
        }
      : null;
    return { ...fit, status: fit.status as FitView['status'], curveBasis };
  });
}
