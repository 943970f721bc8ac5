import 'server-only';
import { loadActor } from '@/lib/auth/load-actor';
import type { Actor } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import type { JobContext } from '@/lib/jobs/job-types';
import type { PlateForecastsPayload } from '@/lib/jobs/payloads';
import { enqueueJob, type QueuedJob } from '@/lib/jobs/queue';
import { getPlateForecast, listPlateForecasts } from './plate-forecast';

/**
 * Queues a forecast run over the plate: every compound with usable potencies whose forecast is not
 * yet stored, one after another, with its progress on the plate's page. One run per plate waits at a time.
 */
export async function startPlateForecasts(
  actor: Actor,
  plateId: string,
  at: number | null,
): Promise<QueuedJob & { total: number }> {
  const list = await listPlateForecasts(actor, plateId);
  const total = list.compounds.filter((c) => c.reason === null && !c.stored).length;
  if (total === 0)
    throw new AppError(
      'conflict',
      `Every forecast of plate ${list.plate.label} that can be computed is stored already.`,
    );
  const job = await enqueueJob({
    kind: 'plate-forecasts',
    key: `plate-forecasts:${plateId}`,
    data: { plateId, at, requestedBy: actor.id },
    plateId,
    requestedBy: actor.id,
    total,
  });
  return { ...job, total };
}

/** The plate-forecasts job's handler (lib/jobs/registry.ts): computes each missing forecast here and reports progress. */
export async function runPlateForecasts(
  data: PlateForecastsPayload,
  { progress }: Pick<JobContext, 'progress'>,
): Promise<string> {
  const actor = await loadActor(data.requestedBy, 'job');
  if (!actor) throw new AppError('invalid', 'The person who asked for this run can no longer sign in.');
  const list = await listPlateForecasts(actor, data.plateId);
  const todo = list.compounds.filter((c) => c.reason === null && !c.stored);
  const at = data.at ?? Math.max(0, list.exposures_uM.length - 1);
  await progress(0, todo.length);
  let done = 0;
  for (const compound of todo) {
    await getPlateForecast(actor, data.plateId, compound.compoundId, at, { here: true });
    await progress(++done);
  }
  return `${done} forecast(s) computed and stored.`;
}
