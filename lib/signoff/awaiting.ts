import 'server-only';
import { can, type Actor } from '@/lib/auth/roles';

/**
 * SQL condition on `plates p` for plates waiting for this person's signature: the state a role acts
 * on, less the plates segregation of duties bars them from (the rules of SIGNOFF_STEPS in steps.ts).
 * Returns null when the person signs no step at all.
 */
export function awaitingCondition(
  actor: Actor,
): { sql: string; replacements: Record<string, unknown> } | null {
  const parts: string[] = [];
  if (can(actor, 'verifyCompoundMap'))
    parts.push(`(p.state = 'imported' and p.imported_by <> :awaitingActor)`);
  if (can(actor, 'submitPlates'))
    parts.push(
      `((p.state = 'verified' and p.verified_by is distinct from :awaitingActor) or p.state = 'rejected')`,
    );
  if (can(actor, 'decidePlates')) {
    parts.push(
      `(p.state = 'submitted' and p.imported_by <> :awaitingActor and p.verified_by is distinct from :awaitingActor and p.submitted_by is distinct from :awaitingActor)`,
    );
  }
  if (!parts.length) return null;
  return { sql: `(${parts.join(' or ')})`, replacements: { awaitingActor: actor.id } };
}
