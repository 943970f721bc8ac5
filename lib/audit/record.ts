import 'server-only';
import type { Transaction } from 'sequelize';
import { AuditEvent } from '@/models';

export interface AuditEntry {
  actorId: string | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
  address?: string | null;
}

/** Appends one audit event inside the caller's transaction, so the change and its record commit together. */
export async function recordAudit(entry: AuditEntry, transaction: Transaction): Promise<void> {
  await AuditEvent.create(
    {
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId ?? null,
      before: entry.before ?? null,
      after: entry.after ?? null,
      reason: entry.reason ?? null,
      address: entry.address ?? null,
    },
    { transaction },
  );
}
