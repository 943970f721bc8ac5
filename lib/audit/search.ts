import 'server-only';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { parseOrRefuse } from '@/lib/validation/parse';
import { AppError } from '@/lib/errors';
import { AUDIT_PAGE_SIZE, auditFilterSchema, type AuditFilter } from '@/lib/validation/audit';
import {
  countAuditEvents,
  selectAuditEntityTypes,
  selectAuditEvents,
  selectPeopleLabels,
  type AuditRow,
} from './queries';

export type { AuditRow } from './queries';

export interface AuditPage {
  rows: AuditRow[];
  total: number;
  page: number;
  pageSize: number;
}

/**
 * The audit trail, newest first, filtered in the database by record type, record id, person and time
 * range (from inclusive, to exclusive). Admins and approvers only.
 */
export async function searchAudit(actor: Actor, rawFilter: unknown): Promise<AuditPage> {
  requireCapability(actor, 'readAudit');
  const filter = parseOrRefuse(auditFilterSchema, rawFilter, 'The filter is not valid.');
  const total = await countAuditEvents(filter);
  const rows = await selectAuditEvents(filter, AUDIT_PAGE_SIZE, (filter.page - 1) * AUDIT_PAGE_SIZE);
  return { rows, total, page: filter.page, pageSize: AUDIT_PAGE_SIZE };
}

/** Most events one export holds: beyond it the person narrows the filter. */
export const AUDIT_EXPORT_LIMIT = 100_000;

/**
 * Every event the filter matches (its page ignored), newest first, for an export: refused with a clear
 * message when more than `limit` match. Admins and approvers only.
 */
export async function auditEventsForExport(
  actor: Actor,
  rawFilter: unknown,
  limit = AUDIT_EXPORT_LIMIT,
): Promise<{ filter: AuditFilter; rows: AuditRow[] }> {
  requireCapability(actor, 'readAudit');
  const filter = parseOrRefuse(auditFilterSchema, rawFilter, 'The filter is not valid.');
  const rows = await selectAuditEvents(filter, limit + 1, 0);
  if (rows.length > limit) {
    throw new AppError(
      'invalid',
      `More than ${limit.toLocaleString('en-GB')} events match; an export holds at most that many. Narrow the time range or the filter.`,
    );
  }
  return { filter, rows };
}

/** The choices of the audit filter: record types that occur, and people. Admins and approvers only. */
export async function auditFilterChoices(
  actor: Actor,
): Promise<{ entityTypes: string[]; people: { id: string; label: string }[] }> {
  requireCapability(actor, 'readAudit');
  const [types, people] = await Promise.all([selectAuditEntityTypes(), selectPeopleLabels()]);
  return { entityTypes: types.map((row) => row.entityType), people };
}
