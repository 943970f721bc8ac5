import 'server-only';
import { csvText, workbookBytes, type ExportDocument } from './document';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** A name safe in a download header: letters, digits, dot, dash and underscore. */
const safe = (name: string) => name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '') || 'export';

/** The export as a download: the whole workbook, or one table as csv. */
export function exportResponse(doc: ExportDocument, query: { format: 'xlsx' | 'csv'; table?: string }, baseName: string): Response {
  const headers = { 'cache-control': 'no-store', 'x-content-type-options': 'nosniff' };
  if (query.format === 'xlsx') {
    return new Response(new Uint8Array(workbookBytes(doc)), {
      headers: { ...headers, 'content-type': XLSX_TYPE, 'content-disposition': `attachment; filename="${safe(baseName)}.xlsx"` },
    });
  }
  const table = doc.tables.find((t) => t.key === query.table)!;
  return new Response(csvText(doc, table), {
    headers: { ...headers, 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${safe(`${baseName}-${table.key}`)}.csv"` },
  });
}
