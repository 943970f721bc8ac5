import 'server-only';
import type { Transaction } from 'sequelize';
import { db } from '@/lib/db';
import type { PlateFitsPayload } from '@/lib/jobs/payloads';
import { platesWithoutOpenRefit } from '@/lib/jobs/queries';
import { enqueueJob, type QueuedJob } from '@/lib/jobs/queue';
import { analysePlate, fitKey, type PlateAnalysis } from '@/lib/science/plate-analysis';
import { Fit, Plate, Readout, Screen, Well } from '@/models';
import { analysisInput } from './analysis-input';
import { fitRow } from './fit-row';
import { analysisSettings } from './settings';

/** The plate's stored wells and readouts through the science, with each fit's chosen model. */
async function analyseStored(
  plate: Plate,
  transaction: Transaction,
  fits: boolean,
): Promise<{ analysis: PlateAnalysis; readouts: Readout[] }> {
  const screen = await Screen.findByPk(plate.screenId, { transaction, rejectOnEmpty: true });
  const wells = await Well.findAll({ where: { plateId: plate.id }, transaction });
  const readouts = await Readout.findAll({ where: { wellId: wells.map((w) => w.id) }, transaction });
  // Each fit keeps its chosen model; QC alone (fits: false) needs none of them.
  const previous = fits ? await Fit.findAll({ where: { plateId: plate.id }, transaction }) : [];
  const chosen = Object.fromEntries(previous.map((f) => [fitKey(f.compoundId, f.targetId), f.model]));
  const science = analysisInput(wells, readouts);
  const analysis = analysePlate(science.wells, science.readouts, analysisSettings(screen, chosen), { fits });
  return { analysis, readouts };
}

/** Queues the fit job of a plate whose fits are marked pending (in the caller's transaction when given). */
export function queueRefit(
  plateId: string,
  requestedBy: string | null,
  transaction?: Transaction,
): Promise<QueuedJob> {
  return enqueueJob(
    {
      kind: 'plate-fits',
      key: `plate-fits:${plateId}`,
      data: { plateId, requestedBy },
      plateId,
      requestedBy,
    },
    transaction,
  );
}

/** Marks the plate's fits as waiting for a refit and queues it, in the caller's transaction. */
export async function requestRefit(
  plate: Plate,
  requestedBy: string | null,
  transaction: Transaction,
): Promise<QueuedJob> {
  await plate.update({ fitsPending: true, fitsRequestedAt: new Date() }, { transaction });
  return queueRefit(plate.id, requestedBy, transaction);
}

/**
 * After a change to wells or models: recomputes QC, block and Z′ from the stored wells and readouts
 * inside the caller's transaction, bumps the plate version, and queues the refit (lib/jobs).
 */
export async function recomputePlate(plate: Plate, actorId: string, transaction: Transaction): Promise<void> {
  const { analysis, readouts } = await analyseStored(plate, transaction, false);
  const byId = new Map(readouts.map((r) => [r.id, r]));
  for (const result of analysis.readouts) {
    const readout = byId.get(result.id)!;
    if (
      readout.fractionalBlock !== result.block ||
      JSON.stringify(readout.qcReasons) !== JSON.stringify(result.qcReasons)
    ) {
      await readout.update({ fractionalBlock: result.block, qcReasons: result.qcReasons }, { transaction });
    }
  }
  await plate.update({ qcSummary: analysis.targets, version: plate.version + 1 }, { transaction });
  await requestRefit(plate, actorId, transaction);
}

export type RefitOutcome = { refitted: true; fits: number } | { refitted: false; reason: string };

/**
 * The fit job: under the plate's row lock, fits every compound × target of the plate from its wells
 * as they stand now, keeping each fit's chosen model, and marks the fits current. A plate whose fits
 * are already current (an earlier job saw the same changes) is left as it is.
 */
export async function refitPlate(
  plateId: string,
  computedBy: string | null,
  transaction: Transaction,
): Promise<RefitOutcome> {
  const plate = await Plate.findByPk(plateId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!plate) return { refitted: false, reason: 'the plate no longer exists' };
  if (!plate.fitsPending) return { refitted: false, reason: 'its fits were already current' };
  const { analysis } = await analyseStored(plate, transaction, true);
  await Fit.destroy({ where: { plateId: plate.id }, transaction });
  await Fit.bulkCreate(
    analysis.fits.map((f) =>
      fitRow(f, { plateId: plate.id, compoundId: f.compoundId, targetId: f.target, computedBy }),
    ),
    { transaction },
  );
  await plate.update({ fitsPending: false, fittedAt: new Date() }, { transaction });
  return { refitted: true, fits: analysis.fits.length };
}

/** The plate-fits job's handler (lib/jobs/registry.ts): the refit in a transaction of its own. */
export async function runPlateFitsJob(payload: PlateFitsPayload): Promise<string> {
  const outcome = await db().transaction((transaction) =>
    refitPlate(payload.plateId, payload.requestedBy, transaction),
  );
  return outcome.refitted ? `${outcome.fits} fit(s) computed.` : `Nothing to do: ${outcome.reason}.`;
}

/** The plate-fits sweep: queues a refit for every plate whose fits wait with no fit job open; returns how many. */
export async function requeueLostRefits(): Promise<number> {
  const plateIds = await platesWithoutOpenRefit();
  for (const plateId of plateIds) await queueRefit(plateId, null);
  return plateIds.length;
}
