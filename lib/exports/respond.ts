import 'server-only';
import { recordAudit } from '@/lib/audit/record';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { csvText, workbookBytes, type ExportDocument } from './document';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** A name safe in a download header: letters, digits, dot, dash and underscore. */
const safe = (name: string) => name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '') || 'export';

/** The export as a download: the whole workbook, or one table as csv. */
export function exportResponse(
  doc: ExportDocument,
  query: { format: 'xlsx' | 'csv'; table?: string },
  baseName: string,
): Response {
  const headers = { 'cache-control': 'no-store', 'x-content-type-options': 'nosniff' };
  if (query.format === 'xlsx') {
    return new Response(new Uint8Array(workbookBytes(doc)), {
      headers: {
        ...headers,
        'content-type': XLSX_TYPE,
        'content-disposition': `attachment; filename="${safe(baseName)}.xlsx"`,
      },
    });
  }
  const table = doc.tables.find((t) => t.key === query.table)!;
  return new Response(csvText(doc, table), {
    headers: {
      ...headers,
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${safe(`${baseName}-${table.key}`)}.csv"`,
    },
  });
}

/** What an export took out of Gatewell, for its audit event. */
export interface ExportSubject {
  entityType: 'plate' | 'compound' | 'audit_trail';
  entityId: string | null;
  /** More of what was exported, e.g. the audit trail's filter. */
  details?: Record<string, unknown>;
}

/**
 * The export as a download, recorded in the audit trail before it is handed out: who took which data out
 * of Gatewell, when, in which form and how many rows of each table. Without the record, no file.
 */
export async function auditedExportResponse(
  actor: Actor,
  doc: ExportDocument,
  query: { format: 'xlsx' | 'csv'; table?: string },
  baseName: string,
  subject: ExportSubject,
): Promise<Response> {
  const response = exportResponse(doc, query, baseName);
  const file = /filename="([^"]+)"/.exec(response.headers.get('content-disposition') ?? '')?.[1] ?? null;
  const tables = query.format === 'csv' ? doc.tables.filter((t) => t.key === query.table) : doc.tables;
  await db().transaction((transaction) =>
    recordAudit(
      {
        actorId: actor.id,
        action: 'export',
        entityType: subject.entityType,
        entityId: subject.entityId,
        after: {
          format: query.format,
          file,
          rows: Object.fromEntries(tables.map((t) => [t.key, t.rows.length])),
          ...subject.details,
        },
        address: actor.address,
      },
      transaction,
    ),
  );
  return response;
}
