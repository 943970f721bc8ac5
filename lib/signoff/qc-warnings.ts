import 'server-only';
import type { Transaction } from 'sequelize';
import type { AcknowledgedQcWarning } from '@/models/signoff-event';
import { selectPlateQc, type PlateQcRow } from './queries';

/**
 * What the sign-off tells a signer about the plate's QC before they sign: a target whose Z′ is below the
 * screen's limit (as the limit stands now), a target with no Z′ at all, and each QC rule that was not
 * applied because the file carried no readout for it (lib/science/qc/qc-rules.ts).
 */
export interface QcWarning extends AcknowledgedQcWarning {
  code: 'z_prime_below_limit' | 'z_prime_missing' | 'qc_rule_not_applied';
  /** Names the warning and what it is about (`code:target id` or `code:rule`): the set the signer saw. */
  key: string;
  message: string;
}

/** The QC warnings of a plate from its stored QC summary, the screen's Z′ limit and the target names. */
export function qcWarningsOf(row: PlateQcRow): QcWarning[] {
  const name = (id: string) => row.targets.find((t) => t.id === id)?.name ?? id;
  const warnings: QcWarning[] = [];
  for (const t of row.qcSummary) {
    const z = t.zPrime?.zPrime ?? null;
    if (z === null) {
      warnings.push({
        code: 'z_prime_missing',
        key: `z_prime_missing:${t.target}`,
        message: `${name(t.target)}: no Z′ could be worked out${t.zPrime?.message ? ` (${t.zPrime.message.replace(/\.$/, '')})` : ''}, so the plate cannot be judged against the screen's limit of ${row.zPrimeMin}.`,
      });
    } else if (z < row.zPrimeMin) {
      warnings.push({
        code: 'z_prime_below_limit',
        key: `z_prime_below_limit:${t.target}`,
        message: `${name(t.target)}: Z′ ${z.toFixed(2)} is below the screen's limit of ${row.zPrimeMin}.`,
      });
    }
  }
  // The not-applied rules read the wells' recording properties, the same for every target: listed once.
  const rules = new Map(
    row.qcSummary.flatMap((t) => t.qcRulesNotApplied ?? []).map((r) => [r.rule, r] as const),
  );
  for (const r of rules.values()) {
    warnings.push({ code: 'qc_rule_not_applied', key: `qc_rule_not_applied:${r.rule}`, message: r.message });
  }
  return warnings;
}

/** The plate's QC warnings as they stand, in the caller's transaction when given. */
export async function plateQcWarnings(plateId: string, transaction?: Transaction): Promise<QcWarning[]> {
  const row = await selectPlateQc(plateId, transaction);
  return row ? qcWarningsOf(row) : [];
}

/** The keys of a list of warnings as the sign-off form sends them back: sorted, one line. */
export const qcWarningKeys = (warnings: readonly { key: string }[]): string =>
  warnings
    .map((w) => w.key)
    .sort()
    .join(' ');
