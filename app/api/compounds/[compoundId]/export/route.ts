import { withUser } from '@/lib/api/handler';
import { compoundExport } from '@/lib/exports/compound-export';
import { auditedExportResponse } from '@/lib/exports/respond';
import { compoundExportQuerySchema } from '@/lib/validation/exports';
import { parseId } from '@/lib/validation/ids';

/** A compound profile (potency across plates, selectivity, forecast, sign-off) as xlsx, or one table as csv; audited. */
export const GET = withUser<{ compoundId: string }>(async (request, actor, { params }) => {
  const compoundId = parseId((await params).compoundId, 'compound');
  const query = compoundExportQuerySchema.parse(Object.fromEntries(request.nextUrl.searchParams));
  const { identifier, document } = await compoundExport(actor, compoundId);
  return auditedExportResponse(actor, document, query, `gatewell-compound-${identifier}`, {
    entityType: 'compound',
    entityId: compoundId,
  });
});
