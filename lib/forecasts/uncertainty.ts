import 'server-only';
import { cholesky2, type PotencyUncertaintyInput } from '@/lib/science/forecast/uncertainty';
import type { TargetPotency } from '@/lib/validation/forecasts';
import { selectFitUncertainties, selectFitWells } from './queries';

/** The top-left 2 × 2 block (log10 IC50, Hill slope) of a fit's covariance, or null. */
function potencyCovariance(covariance: number[][] | null | undefined): number[][] | null {
  const c = covariance;
  if (!c?.[0] || !c[1] || c[0].length < 2 || c[1].length < 2) return null;
  return [
    [c[0][0]!, c[0][1]!],
    [c[1][0]!, c[1][1]!],
  ];
}

/**
 * What is known of the uncertainty of each used potency's fit, by fit id: its covariance of log IC50 and
 * Hill slope with the degrees of freedom behind it, or, where that is unusable, its wells for a bootstrap.
 */
export async function potencyUncertainties(
  potencies: TargetPotency[],
): Promise<Map<string, PotencyUncertaintyInput>> {
  const ids = [...new Set(potencies.flatMap((p) => (p.use === 'used' && p.fitId ? [p.fitId] : [])))];
  const rows = await selectFitUncertainties(ids);
  const result = new Map<string, PotencyUncertaintyInput>();
  for (const row of rows) {
    const covariance = potencyCovariance(row.estimate?.covariance);
    const dof = row.estimate?.degreesOfFreedom;
    if (covariance && cholesky2(covariance)) {
      result.set(row.id, {
        covariance,
        degreesOfFreedom: dof !== undefined && Number.isInteger(dof) && dof >= 1 ? dof : null,
      });
    } else {
      result.set(row.id, { covariance: null, wells: await selectFitWells(row), model: row.model });
    }
  }
  return result;
}

/** The uncertainty of a compound's used potencies by conductance, as a forecast request takes it. */
export function uncertaintyOf(
  potencies: TargetPotency[],
  byFit: Map<string, PotencyUncertaintyInput>,
): Record<string, PotencyUncertaintyInput> {
  return Object.fromEntries(
    potencies.flatMap((p) => {
      const u = p.use === 'used' && p.fitId ? byFit.get(p.fitId) : undefined;
      return u ? [[p.conductance, u]] : [];
    }),
  );
}
