import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { hillBand, type BandPoint } from '@/lib/science/fit/hill-band';
import type { FitView } from '@/lib/validation/plates';
import { listPlateFits, type FitRow } from './detail';
import { selectFitEstimatesWithRanges } from './queries';

/** 121 log-spaced concentrations from a decade below to a decade above the tested range (µM). */
function grid(lowest: number, highest: number): number[] {
  const from = Math.log10(lowest) - 1;
  const to = Math.log10(highest) + 1;
  return Array.from({ length: 121 }, (_, i) => 10 ** (from + ((to - from) * i) / 120));
}

/** The plate's fits with the fitted curve and its 95 % band, ready to plot. */
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
    const curve: BandPoint[] = drawable
      ? hillBand(
          fit.model,
          estimate.parameters!,
          estimate.covariance ?? null,
          estimate.degreesOfFreedom ?? 0,
          grid(extra.lowest!, extra.highest!),
        )
      : [];
    return { ...fit, status: fit.status as FitView['status'], curve };
  });
}
