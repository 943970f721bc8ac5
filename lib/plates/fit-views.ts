import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { hillBand, type BandPoint } from '@/lib/science/fit/hill-band';
import type { FitView } from '@/lib/validation/plates';
import { listPlateFits, type FitRow } from './detail';

interface Estimate {
  parameters?: number[];
  covariance?: number[][] | null;
  degreesOfFreedom?: number;
}

/** 121 log-spaced concentrations from a decade below to a decade above the tested range (µM). */
function grid(lowest: number, highest: number): number[] {
  const from = Math.log10(lowest) - 1;
  const to = Math.log10(highest) + 1;
  return Array.from({ length: 121 }, (_, i) => 10 ** (from + ((to - from) * i) / 120));
}

/** The plate's fits with the fitted curve and its 95 % band, ready to plot. */
export async function listFitViews(actor: Actor, plateId: string): Promise<FitView[]> {
  const fits = await listPlateFits(actor, plateId);
  const rows = await db().query<{ id: string; estimate: Estimate | null; lowest: number | null; highest: number | null }>(
    // Each compound's tested range, read once over the plate's wells (not once per fit and target).
    `with ranges as (
       select w.compound_id, min(w.concentration_um) filter (where w.concentration_um > 0) as lowest, max(w.concentration_um) as highest
         from wells w where w.plate_id = :plateId and w.compound_id is not null group by w.compound_id
     )
     select f.id, f.estimate, r.lowest, r.highest
       from fits f left join ranges r on r.compound_id = f.compound_id
      where f.plate_id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  const byId = new Map(rows.map((r) => [r.id, r]));
  return fits.map((fit: FitRow) => {
    const extra = byId.get(fit.id);
    const estimate = extra?.estimate;
    const drawable = estimate?.parameters && (fit.status === 'fitted' || fit.status === 'above_range') && extra?.lowest && extra.highest;
    const curve: BandPoint[] = drawable
      ? hillBand(fit.model, estimate.parameters!, estimate.covariance ?? null, estimate.degreesOfFreedom ?? 0, grid(extra.lowest!, extra.highest!))
      : [];
    return { ...fit, status: fit.status as FitView['status'], curve };
  });
}
