import 'server-only';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import type { Actor } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import { CompoundAlias } from '@/models';
import { selectAllCompoundNames, selectCompoundsByUpperName, type NamedCompound } from './queries';

/**
 * Compound aliases: another name of a registered compound, as an instrument file writes it. Every import
 * reads identifiers and aliases alike (`knownCompoundNames` for the check, `resolveCompoundNames` for the
 * store), so a file that uses an alias needs no click once the alias exists.
 */

/** How a file's identifier is kept as an alias: trimmed, inner white space made single, case kept. */
export const aliasText = (text: string): string => text.trim().replace(/\s+/g, ' ');

/** Every identifier and alias, as the import's check matches them. */
export async function knownCompoundNames(transaction?: Transaction): Promise<string[]> {
  return selectAllCompoundNames(transaction);
}

/** The registered compound of each name (identifier or alias), keyed by the name upper-cased. */
export async function resolveCompoundNames(
  names: readonly string[],
  transaction?: Transaction,
): Promise<Map<string, NamedCompound>> {
  const upper = [...new Set(names.map((n) => aliasText(n).toUpperCase()))];
  const found = await selectCompoundsByUpperName(upper, transaction);
  return new Map(found.map((f) => [f.name, f]));
}

/**
 * Adds an alias of a registered compound with its audit event in the caller's transaction (which holds
 * lockCompoundNames). Refused when the name is already an identifier or an alias.
 */
export async function insertAlias(
  actor: Actor,
  input: { alias: string; compoundIdentifier: string; draftId?: string | null },
  transaction: Transaction,
): Promise<{ id: string; alias: string; compoundId: string; compoundIdentifier: string }> {
  const alias = aliasText(input.alias);
  const resolved = await resolveCompoundNames([alias, input.compoundIdentifier], transaction);
  const taken = resolved.get(alias.toUpperCase());
  if (taken) {
    throw new AppError(
      'conflict',
      taken.identifier.toUpperCase() === alias.toUpperCase()
        ? `${alias} is already a registered compound.`
        : `${alias} is already an alias of ${taken.identifier}.`,
    );
  }
  const target = resolved.get(aliasText(input.compoundIdentifier).toUpperCase());
  if (!target)
    throw new AppError(
      'invalid',
      `${input.compoundIdentifier} is not a registered compound; map ${alias} to one that is.`,
    );
  const row = await CompoundAlias.create(
    { alias, compoundId: target.id, createdBy: actor.id },
    { transaction },
  );
  const record = { id: row.id, alias, compoundId: target.id, compoundIdentifier: target.identifier };
  await recordAudit(
    {
      actorId: actor.id,
      action: 'create',
      entityType: 'compound_alias',
      entityId: record.id,
      after: { ...record, draftId: input.draftId ?? null },
      address: actor.address,
    },
    transaction,
  );
  return record;
}
