import 'server-only';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { listWaitingDrafts } from '@/lib/plates/import-drafts';
import { compoundSchema } from '@/lib/validation/compounds';
import { unknownCompoundsSchema, type UnknownCompoundsInput } from '@/lib/validation/import-compounds';
import { aliasText, insertAlias, resolveCompoundNames } from './aliases';
import { queueReadyNotice } from './import-notices';
import { lockCompoundNames } from './queries';
import { insertBatch, insertCompound } from './service';

export interface UnknownCompoundsResult {
  registered: { identifier: string; lot: string | null }[];
  aliased: { alias: string; compoundIdentifier: string }[];
  /** Waiting imports that lack no compound any more (their owners are told by e-mail). */
  readyDrafts: string[];
}

/** Why a file's identifier cannot be registered as it is written, or null. */
function identifierProblem(identifier: string): string | null {
  const parsed = compoundSchema.shape.identifier.safeParse(identifier);
  if (parsed.success) return null;
  const reason = parsed.error.issues[0]!.message.replace(/\.$/, '');
  return `${identifier} cannot be registered as written (${reason.charAt(0).toLowerCase()}${reason.slice(1)}); map it to a registered compound as an alias instead.`;
}

/**
 * Registers the compound identifiers of a file that the registry lacks (each with its first batch when a
 * lot is given) and maps others to registered compounds as aliases, in one transaction with an audit event
 * each. Every entry is checked first: with any problem nothing is written. Waiting imports that lack
 * nothing afterwards are announced to their owners in the same transaction.
 */
export async function resolveUnknownCompounds(
  actor: Actor,
  raw: UnknownCompoundsInput,
): Promise<UnknownCompoundsResult> {
  requireCapability(actor, 'registerCompounds');
  const input = unknownCompoundsSchema.parse(raw);
  const names = [...input.register.map((r) => r.identifier), ...input.aliases.map((a) => a.alias)].map(
    aliasText,
  );
  const problems: string[] = [];
  const seen = new Set<string>();
  for (const name of names) {
    if (seen.has(name.toUpperCase()))
      problems.push(`${name} is named twice; choose one thing to do with it.`);
    seen.add(name.toUpperCase());
  }
  for (const r of input.register) {
    const problem = identifierProblem(aliasText(r.identifier));
    if (problem) problems.push(problem);
  }
  return db().transaction(async (transaction) => {
    await lockCompoundNames(transaction);
    const known = await resolveCompoundNames(
      [...names, ...input.aliases.map((a) => a.compoundIdentifier)],
      transaction,
    );
    for (const name of names) {
      const found = known.get(name.toUpperCase());
      if (!found) continue;
      problems.push(
        found.identifier.toUpperCase() === name.toUpperCase()
          ? `${name} is already registered.`
          : `${name} is already an alias of ${found.identifier}.`,
      );
    }
    for (const a of input.aliases) {
      if (!known.has(aliasText(a.compoundIdentifier).toUpperCase()))
        problems.push(
          `${a.compoundIdentifier} is not a registered compound; map ${aliasText(a.alias)} to one that is.`,
        );
    }
    if (problems.length) throw new AppError('invalid', problems.join(' '), { problems });

    const result: UnknownCompoundsResult = { registered: [], aliased: [], readyDrafts: [] };
    for (const r of input.register) {
      const compound = await insertCompound(
        actor,
        { identifier: aliasText(r.identifier), name: '', smiles: '', molecularWeight: null },
        transaction,
      );
      if (r.lot)
        await insertBatch(
          actor,
          compound.id,
          { lot: r.lot, purity_percent: null, stockConcentration_mM: null, solvent: 'DMSO' },
          transaction,
        );
      result.registered.push({ identifier: compound.identifier, lot: r.lot || null });
    }
    for (const a of input.aliases) {
      const alias = await insertAlias(
        actor,
        { alias: a.alias, compoundIdentifier: a.compoundIdentifier, draftId: input.draftId ?? null },
        transaction,
      );
      result.aliased.push({ alias: alias.alias, compoundIdentifier: alias.compoundIdentifier });
    }

    // Waiting imports that named one of these and now lack nothing: their owners hear of it.
    const added = new Set(names.map((n) => n.toUpperCase()));
    for (const draft of await listWaitingDrafts({}, transaction)) {
      if (!draft.waitingFor.some((id) => added.has(aliasText(id).toUpperCase()))) continue;
      const resolved = await resolveCompoundNames(draft.waitingFor, transaction);
      if (draft.waitingFor.every((id) => resolved.has(aliasText(id).toUpperCase()))) {
        await queueReadyNotice(actor, draft, transaction);
        result.readyDrafts.push(draft.id);
      }
    }
    return result;
  });
}
