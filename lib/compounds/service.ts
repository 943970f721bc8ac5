import 'server-only';
import { UniqueConstraintError, type Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import type { BatchInput, CompoundInput } from '@/lib/validation/compounds';
import { Batch, Compound } from '@/models';
import { resolveCompoundNames } from './aliases';
import { lockCompoundNames, selectApprovedPlateLabels } from './queries';

export interface CompoundRecord {
  id: string;
  identifier: string;
  name: string;
  smiles: string;
  molecularWeight: number | null;
}

export interface BatchRecord {
  id: string;
  compoundId: string;
  lot: string;
  purity_percent: number | null;
  stockConcentration_mM: number | null;
  solvent: string;
}

const toCompound = (c: Compound): CompoundRecord => ({
  id: c.id,
  identifier: c.identifier,
  name: c.name,
  smiles: c.smiles,
  molecularWeight: c.molecularWeight,
});
const toBatch = (b: Batch): BatchRecord => ({
  id: b.id,
  compoundId: b.compoundId,
  lot: b.lot,
  purity_percent: b.purity_percent,
  stockConcentration_mM: b.stockConcentration_mM,
  solvent: b.solvent,
});

/** Refuses an identifier that is already another compound's alias (under lockCompoundNames). */
async function refuseAliasClash(identifier: string, transaction: Transaction): Promise<void> {
  await lockCompoundNames(transaction);
  const found = (await resolveCompoundNames([identifier], transaction)).get(identifier.toUpperCase());
  if (found && found.identifier.toUpperCase() !== identifier.toUpperCase()) {
    const message = `${identifier} is already an alias of ${found.identifier}.`;
    throw new AppError('conflict', message, { fieldErrors: { identifier: [message] } });
  }
}

function duplicate(error: unknown, message: string, field: string): never {
  if (error instanceof UniqueConstraintError)
    throw new AppError('conflict', message, { fieldErrors: { [field]: [message] } });
  throw error;
}

/** Registers a compound inside the caller's transaction (shared by single and bulk registration). */
export async function insertCompound(
  actor: Actor,
  input: CompoundInput,
  transaction: Transaction,
): Promise<CompoundRecord> {
  await refuseAliasClash(input.identifier, transaction);
  const compound = await Compound.create({ ...input, createdBy: actor.id }, { transaction }).catch((error) =>
    duplicate(error, `A compound with identifier ${input.identifier} is already registered.`, 'identifier'),
  );
  const record = toCompound(compound);
  await recordAudit(
    {
      actorId: actor.id,
      action: 'create',
      entityType: 'compound',
      entityId: record.id,
      after: record,
      address: actor.address,
    },
    transaction,
  );
  return record;
}

/** Registers one compound (chemist or admin). */
export async function createCompound(actor: Actor, input: CompoundInput): Promise<CompoundRecord> {
  requireCapability(actor, 'registerCompounds');
  return db().transaction((transaction) => insertCompound(actor, input, transaction));
}

/**
 * An approved plate's signed content names its compounds by identifier, so the identifier of a compound
 * that any approved plate uses stays as it is (the database refuses it too: migration 20261210001900).
 * A new name for such a compound goes in as an alias, which imports resolve to it.
 */
async function refuseRenameOnApprovedPlates(compound: Compound, transaction: Transaction): Promise<void> {
  const labels = await selectApprovedPlateLabels(compound.id, transaction);
  if (labels.length === 0) return;
  const shown =
    labels.length > 5 ? `${labels.slice(0, 5).join(', ')} and ${labels.length - 5} more` : labels.join(', ');
  throw new AppError(
    'locked',
    `${compound.identifier} is used on approved plate${labels.length === 1 ? '' : 's'} ${shown}, whose signed content names it, so its identifier cannot change; nothing was changed. Keep ${compound.identifier} and use the new name as an alias of it: an import whose file uses the new name offers to map it to ${compound.identifier}.`,
    { fieldErrors: { identifier: [`Used on approved plates; add the new name as an alias instead.`] } },
  );
}

/** Edits a compound's identity fields; the audit event keeps before and after. */
export async function updateCompound(
  actor: Actor,
  compoundId: string,
  input: CompoundInput,
): Promise<CompoundRecord> {
  requireCapability(actor, 'registerCompounds');
  return db().transaction(async (transaction) => {
    const compound = await Compound.findByPk(compoundId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!compound) throw new AppError('not_found', 'No such compound.');
    const before = toCompound(compound);
    if (input.identifier !== compound.identifier) await refuseRenameOnApprovedPlates(compound, transaction);
    await refuseAliasClash(input.identifier, transaction);
    await compound
      .update(input, { transaction })
      .catch((error) =>
        duplicate(
          error,
          `A compound with identifier ${input.identifier} is already registered.`,
          'identifier',
        ),
      );
    const after = toCompound(compound);
    await recordAudit(
      {
        actorId: actor.id,
        action: 'update',
        entityType: 'compound',
        entityId: compoundId,
        before,
        after,
        address: actor.address,
      },
      transaction,
    );
    return after;
  });
}

/** Adds a batch inside the caller's transaction. */
export async function insertBatch(
  actor: Actor,
  compoundId: string,
  input: BatchInput,
  transaction: Transaction,
): Promise<BatchRecord> {
  const batch = await Batch.create({ ...input, compoundId, createdBy: actor.id }, { transaction }).catch(
    (error) => duplicate(error, `Batch ${input.lot} is already registered for this compound.`, 'lot'),
  );
  const record = toBatch(batch);
  await recordAudit(
    {
      actorId: actor.id,
      action: 'create',
      entityType: 'batch',
      entityId: record.id,
      after: record,
      address: actor.address,
    },
    transaction,
  );
  return record;
}

/** Registers a batch of an existing compound (chemist or admin). */
export async function addBatch(actor: Actor, compoundId: string, input: BatchInput): Promise<BatchRecord> {
  requireCapability(actor, 'registerCompounds');
  return db().transaction(async (transaction) => {
    const compound = await Compound.findByPk(compoundId, { transaction });
    if (!compound) throw new AppError('not_found', 'No such compound.');
    return insertBatch(actor, compoundId, input, transaction);
  });
}

/** One compound with its batches, or not_found. */
export async function getCompound(
  actor: Actor,
  compoundId: string,
): Promise<CompoundRecord & { batches: BatchRecord[] }> {
  void actor; // every signed-in role may read the registry
  db();
  const compound = await Compound.findByPk(compoundId, {
    include: [{ model: Batch, as: 'batches' }],
    order: [[{ model: Batch, as: 'batches' }, 'lot', 'ASC']],
  });
  if (!compound) throw new AppError('not_found', 'No such compound.');
  return { ...toCompound(compound), batches: ((compound.get('batches') as Batch[]) ?? []).map(toBatch) };
}
