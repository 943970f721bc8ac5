import 'server-only';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { parseOrRefuse } from '@/lib/validation/parse';
import { AppError } from '@/lib/errors';
import { env } from '@/lib/env';
import {
  AUDIT_PAGE_SIZE,
  auditFilterSchemaFor,
  auditSuggestionsSchema,
  type AuditFilter,
} from '@/lib/validation/audit';
import type { NameLookup } from './field-labels';
import {
  countAuditEvents,
  selectAuditActions,
  selectAuditEntityTypes,
  selectAuditEvents,
  selectNamesOf,
  selectCompoundIdentifiersLike,
  selectPeopleLabels,
  selectPlateLabelsLike,
  type AuditRow,
} from './queries';

export type { AuditRow } from './queries';

export interface AuditPage {
  rows: AuditRow[];
  /** Names of the plates, compounds, screens, targets and people the rows' values refer to, by id. */
  names: NameLookup;
  total: number;
  page: number;
  pageSize: number;
  /** The IANA time zone the filter's times were read in and the page shows times in. */
  timeZone: string;
}

/** The time zone the audit trail shows and reads times in (GATEWELL_TIME_ZONE, UTC unless set). */
export const auditTimeZone = (): string => env().GATEWELL_TIME_ZONE;

/** The audit filter's schema in the configured time zone. */
export const auditFilterSchemaHere = () => auditFilterSchemaFor(auditTimeZone());

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Every id-shaped string among the values of the rows' before and after (top level and lists). */
function referencedIds(rows: AuditRow[]): string[] {
  const ids = new Set<string>();
  const visit = (value: unknown) => {
    if (typeof value === 'string' && UUID.test(value)) ids.add(value.toLowerCase());
    else if (Array.isArray(value)) value.forEach(visit);
  };
  for (const row of rows)
    for (const side of [row.before, row.after])
      if (side && typeof side === 'object' && !Array.isArray(side)) Object.values(side).forEach(visit);
  return [...ids];
}

/** The names of the records the rows' values refer to, in one query. */
export async function namesForRows(rows: AuditRow[]): Promise<NameLookup> {
  const found = await selectNamesOf(referencedIds(rows));
  return Object.fromEntries(found.map((row) => [row.id, row.name]));
}

/**
 * The audit trail, newest first, filtered in the database by record type, record id, person and time
 * range (from inclusive, to exclusive). Admins and approvers only.
 */
export async function searchAudit(actor: Actor, rawFilter: unknown): Promise<AuditPage> {
  requireCapability(actor, 'readAudit');
  const timeZone = auditTimeZone();
  const filter = parseOrRefuse(auditFilterSchemaFor(timeZone), rawFilter, 'The filter is not valid.');
  const total = await countAuditEvents(filter);
  const rows = await selectAuditEvents(filter, AUDIT_PAGE_SIZE, (filter.page - 1) * AUDIT_PAGE_SIZE);
  return {
    rows,
    names: await namesForRows(rows),
    total,
    page: filter.page,
    pageSize: AUDIT_PAGE_SIZE,
    timeZone,
  };
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
): Promise<{ filter: AuditFilter; rows: AuditRow[]; names: NameLookup; timeZone: string }> {
  requireCapability(actor, 'readAudit');
  const timeZone = auditTimeZone();
  const filter = parseOrRefuse(auditFilterSchemaFor(timeZone), rawFilter, 'The filter is not valid.');
  const rows = await selectAuditEvents(filter, limit + 1, 0);
  if (rows.length > limit) {
    throw new AppError(
      'invalid',
      `More than ${limit.toLocaleString('en-GB')} events match; an export holds at most that many. Narrow the time range or the filter.`,
    );
  }
  return { filter, rows, names: await namesForRows(rows), timeZone };
}

export interface AuditFilterChoices {
  entityTypes: string[];
  actions: string[];
  people: { id: string; label: string }[];
}

/**
 * The choices of the audit filter: kinds of object and of event that occur, and people. Plate labels and
 * compound identifiers are suggested as they are typed (`auditFilterSuggestions`), not listed on each page.
 * Admins and approvers only.
 */
export async function auditFilterChoices(actor: Actor): Promise<AuditFilterChoices> {
  requireCapability(actor, 'readAudit');
  const [types, actions, people] = await Promise.all([
    selectAuditEntityTypes(),
    selectAuditActions(),
    selectPeopleLabels(),
  ]);
  return {
    entityTypes: types.map((row) => row.entityType),
    actions: actions.map((row) => row.action),
    people,
  };
}

/** Suggestions in one answer (our choice: what a datalist shows without scrolling far). */
export const AUDIT_SUGGESTION_LIMIT = 20;

/**
 * What the audit filter's plate or compound field suggests for the text typed so far: plate labels holding
 * it, newest import first, or compound identifiers holding it (case-insensitive), at most
 * AUDIT_SUGGESTION_LIMIT. Input from the query string (`kind`, `q`), checked by zod. Admins and approvers only.
 */
export async function auditFilterSuggestions(actor: Actor, input: unknown): Promise<string[]> {
  requireCapability(actor, 'readAudit');
  const { kind, q } = parseOrRefuse(auditSuggestionsSchema, input);
  return kind === 'plate'
    ? selectPlateLabelsLike(q, AUDIT_SUGGESTION_LIMIT)
    : selectCompoundIdentifiersLike(q, AUDIT_SUGGESTION_LIMIT);
}
