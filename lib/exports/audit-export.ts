import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { auditEventsForExport } from '@/lib/audit/search';
import { changeText, eventKindLabel, objectKindLabel } from '@/lib/audit/field-labels';
import { wallClockText } from '@/lib/domain/time-zone';
import type { AuditFilter } from '@/lib/validation/audit';
import type { Cell, ExportDocument } from './document';

const iso = (date: Date) => date.toISOString().replace(/\.000Z$/, 'Z');

/** The filter in words, for the about lines: what the export holds and what it leaves out. */
function describeFilter(filter: AuditFilter): string {
  const parts = [
    filter.entityType ? `record type ${filter.entityType}` : null,
    filter.entityId ? `record ${filter.entityId}` : null,
    filter.action ? `kind of event ${filter.action}` : null,
    filter.userId ? `person ${filter.userId}` : null,
    filter.plate ? `plate ${filter.plate}` : null,
    filter.compound ? `compound ${filter.compound}` : null,
    filter.from ? `from ${iso(filter.from)}` : null,
    filter.to ? `before ${iso(filter.to)}` : null,
  ].filter((part): part is string => part !== null);
  return parts.length ? parts.join('; ') : 'none: every event';
}

/** JSON of a before/after value for a cell, or nothing. */
const json = (value: unknown): Cell => (value === null || value === undefined ? null : JSON.stringify(value));

/**
 * The audit trail as the filter selects it (every page), newest first, as one table: for reviews and
 * inspections outside Gatewell. Admins and approvers only (auditEventsForExport checks).
 */
export async function auditExport(actor: Actor, rawFilter: unknown): Promise<ExportDocument> {
  const { filter, rows, names, timeZone } = await auditEventsForExport(actor, rawFilter);
  const about: [string, Cell][] = [
    ['Gatewell export', 'Audit trail'],
    ['Filter', describeFilter(filter)],
    ['Events', rows.length],
    ['Order', 'Newest first'],
    ['Local times in', timeZone],
    ['Exported by', `${actor.name} <${actor.email}>`],
    ['Exported at (UTC)', new Date().toISOString().replace(/\.\d+Z$/, 'Z')],
  ];
  return {
    about,
    tables: [
      {
        sheet: 'Audit trail',
        key: 'events',
        // Words for people first (local time, object, changes), then the values as recorded, for tools.
        columns: [
          'Event',
          'Time (UTC)',
          `Local time (${timeZone})`,
          'Person',
          'Roles now',
          'E-mail',
          'What happened',
          'Kind of object',
          'Object',
          'Changes',
          'Action',
          'Record type',
          'Record id',
          'Reason',
          'Before',
          'After',
          'Address',
        ],
        rows: rows.map((r) => [
          r.id,
          r.occurredAt,
          wallClockText(r.occurredAt, timeZone).replace('T', ' '),
          r.actorName,
          r.actorRoles,
          r.actorEmail,
          eventKindLabel(r.action),
          objectKindLabel(r.entityType),
          r.objectName,
          changeText(r.before, r.after, names),
          r.action,
          r.entityType,
          r.entityId,
          r.reason,
          json(r.before),
          json(r.after),
          r.address,
        ]),
      },
    ],
  };
}
