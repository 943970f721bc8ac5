import 'server-only';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import type { HillModelName } from '@/lib/science/fit/hill-model';
import { Fit, Plate, Well } from '@/models';
import { EDITABLE_PLATE_STATES } from '@/lib/domain/plate-states';
import { recomputePlate } from './recompute';

/** Locks the plate row and refuses changes once it is submitted or approved, or when someone changed it meanwhile. */
export async function lockEditablePlate(
  plateId: string,
  expectedVersion: number | undefined,
  transaction: Transaction,
): Promise<Plate> {
  const plate = await Plate.findByPk(plateId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!plate) throw new AppError('not_found', 'No such plate.');
  if (plate.state === 'approved')
    throw new AppError(
      'locked',
      `Plate ${plate.label} is approved and locked; a correction is a new import that references it.`,
    );
  if (!EDITABLE_PLATE_STATES.includes(plate.state))
    throw new AppError(
      'locked',
      `Plate ${plate.label} is submitted for approval; it can change again only if the approver returns it.`,
    );
  if (expectedVersion !== undefined && expectedVersion !== plate.version) {
    throw new AppError(
      'conflict',
      `Plate ${plate.label} was changed by someone else meanwhile; reload to see the change.`,
    );
  }
  return plate;
}

export interface ExclusionChange {
  wellIds: string[];
  excluded: boolean;
  reason: string;
  expectedVersion?: number;
}

/** Excludes or re-includes wells with a reason; QC recomputes at once and the refit is queued; each well's change is audited. */
export async function setWellExclusion(
  actor: Actor,
  plateId: string,
  change: ExclusionChange,
): Promise<{ version: number; changed: number }> {
  requireCapability(actor, 'reviewPlates');
  const reason = change.reason.trim();
  if (!reason)
    throw new AppError('invalid', 'Give a reason for the change.', {
      fieldErrors: { reason: ['Give a reason.'] },
    });
  return db().transaction(async (transaction) => {
    const plate = await lockEditablePlate(plateId, change.expectedVersion, transaction);
    const wells = await Well.findAll({ where: { id: change.wellIds, plateId }, transaction });
    if (wells.length !== new Set(change.wellIds).size)
      throw new AppError('invalid', 'Some of the chosen wells are not on this plate.');
    const toChange = wells.filter((w) => w.excluded !== change.excluded);
    for (const well of toChange) {
      const before = { excluded: well.excluded, exclusionReason: well.exclusionReason };
      await well.update(
        change.excluded
          ? { excluded: true, exclusionReason: reason, excludedBy: actor.id, excludedAt: new Date() }
          : { excluded: false, exclusionReason: null, excludedBy: null, excludedAt: null },
        { transaction },
      );
      await recordAudit(
        {
          actorId: actor.id,
          action: change.excluded ? 'exclude_well' : 'include_well',
          entityType: 'well',
          entityId: well.id,
          reason,
          address: actor.address,
          before,
          after: {
            plateId,
            position: well.position,
            excluded: well.excluded,
            exclusionReason: well.exclusionReason,
          },
        },
        transaction,
      );
    }
    if (toChange.length) await recomputePlate(plate, actor.id, transaction);
    return { version: plate.version, changed: toChange.length };
  });
}

/** Switches one fit between the two- and four-parameter Hill model and queues the refit; audited. */
export async function setFitModel(
  actor: Actor,
  plateId: string,
  change: { compoundId: string; targetId: string; model: HillModelName; expectedVersion?: number },
): Promise<{ version: number }> {
  requireCapability(actor, 'reviewPlates');
  return db().transaction(async (transaction) => {
    const plate = await lockEditablePlate(plateId, change.expectedVersion, transaction);
    const fit = await Fit.findOne({
      where: { plateId, compoundId: change.compoundId, targetId: change.targetId },
      transaction,
    });
    if (!fit) throw new AppError('not_found', 'This plate has no fit for that compound and target.');
    if (fit.model !== change.model) {
      // The refit job keeps each fit's chosen model: record the choice, then queue the refit.
      const before = {
        compoundId: change.compoundId,
        targetId: change.targetId,
        model: fit.model,
        status: fit.status,
        ic50_uM: fit.ic50_uM,
      };
      await fit.update({ model: change.model }, { transaction });
      await recomputePlate(plate, actor.id, transaction);
      await recordAudit(
        {
          actorId: actor.id,
          action: 'change_fit_model',
          entityType: 'plate',
          entityId: plateId,
          address: actor.address,
          before,
          after: { compoundId: change.compoundId, targetId: change.targetId, model: change.model },
        },
        transaction,
      );
    }
    return { version: plate.version };
  });
}
