import { withUser } from '@/lib/api/handler';
import { plateExport } from '@/lib/exports/plate-export';
import { auditedExportResponse } from '@/lib/exports/respond';
import { plateExportQuerySchema } from '@/lib/validation/exports';
import { parseId } from '@/lib/validation/ids';

/** The plate's wells, fits, forecast and sign-off as an xlsx workbook, or one of them as csv; audited. */
export const GET = withUser<{ plateId: string }>(async (request, actor, { params }) => {
  const plateId = parseId((await params).plateId, 'plate');
  const query = plateExportQuerySchema.parse(Object.fromEntries(request.nextUrl.searchParams));
  // A csv file holds one table: only that table is made (the wells alone compute no forecast).
  const { label, document } = await plateExport(
    actor,
    plateId,
    query.format === 'csv' ? [query.table!] : undefined,
  );
  return auditedExportResponse(actor, document, query, `gatewell-plate-${label}`, {
    entityType: 'plate',
    entityId: plateId,
  });
});
